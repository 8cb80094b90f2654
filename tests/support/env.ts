// Integration and browser tests run against the services that `npm test` starts.
export function requireEnv(name: string): string {
  const v = process.env[name];
  if (!v) throw new Error(`${name} is not set: run the integration and browser tests through \`npm test\`.`);
  return v;
}

export const appUrl = () => requireEnv("APP_URL");
