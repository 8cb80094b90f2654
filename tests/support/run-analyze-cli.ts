// Runs the command line exactly as a user does: `npm run analyze -- ARGS`, in a child process.
import { spawnSync, type SpawnSyncReturns } from "node:child_process";

/**
 * Spawns `npm run --silent analyze -- ...args` and waits (at most `timeoutMs`, default 90 s: the
 * machine is shared). Without `env.DATABASE_URL` the CLI judges against the seed files.
 */
export function runAnalyzeCli(args: string[], { env = withoutDatabase(), timeoutMs = 90_000 }: { env?: NodeJS.ProcessEnv; timeoutMs?: number } = {}): SpawnSyncReturns<string> {
  const res = spawnSync("npm", ["run", "--silent", "analyze", "--", ...args], { encoding: "utf8", env, timeout: timeoutMs, maxBuffer: 64 << 20 });
  if (res.error) throw res.error;
  return res;
}

/** The test process's environment less DATABASE_URL. */
export function withoutDatabase(): NodeJS.ProcessEnv {
  const env = { ...process.env };
  delete env.DATABASE_URL;
  return env;
}
