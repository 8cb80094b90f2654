// Runs in the browser before any of the app's components. zod (v4) probes `new Function` the first time it
// builds an object schema, to compile faster parsers; under the Content-Security-Policy (proxy.ts) that probe
// is refused and reported as a violation. The interpreted parsers are used instead, without the probe.
const g = globalThis as unknown as { __zod_globalConfig?: { jitless?: boolean } };
(g.__zod_globalConfig ??= {}).jitless = true;

export {};
