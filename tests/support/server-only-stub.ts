// Tests import server modules directly; the "server-only" guard is a bundler concern.
export {};
