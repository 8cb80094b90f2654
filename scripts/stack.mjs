#!/usr/bin/env node
// The one entry point behind `npm start` and `npm test`.
// It only uses Node's built-in modules so it can run on a fresh clone before `npm ci`.
//
//   start  install what is missing, start PostgreSQL, s3rver and the mail catcher on loopback,
//          migrate, seed, build and serve the app on http://127.0.0.1:3000 until Ctrl-C (scripts/serve.mjs).
//   test   the same on free ports in a temporary directory, then run the vitest projects
//          (unit, integration, e2e), stop everything and exit non-zero on any failure.
//   dev    like start, but the development server (scripts/serve.mjs --dev) instead of a production build.

import { spawn, spawnSync, execFileSync } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const mode = process.argv[2] ?? "start";
const isRoot = process.getuid?.() === 0;
const children = [];
let pg = null;
let stopping = false;

function log(message) {
  process.stdout.write(`[ordwise] ${message}\n`);
}

function fail(message) {
  process.stderr.write(`[ordwise] ${message}\n`);
  shutdown(1);
}

function run(cmd, args, opts = {}) {
  const res = spawnSync(cmd, args, { stdio: "inherit", cwd: root, ...opts });
  if (res.status !== 0) throw new Error(`${cmd} ${args.join(" ")} exited with ${res.status}`);
}

function freePort() {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once("error", reject);
    srv.listen(0, "127.0.0.1", () => {
      const { port } = srv.address();
      srv.close(() => resolve(port));
    });
  });
}

function portInUse(port) {
  return new Promise((resolve) => {
    const sock = net.connect({ port, host: "127.0.0.1" });
    sock.once("connect", () => (sock.destroy(), resolve(true)));
    sock.once("error", () => resolve(false));
  });
}

async function waitForPort(port, what, timeoutMs = 60_000) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (await portInUse(port)) return;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`${what} did not start listening on 127.0.0.1:${port} within ${timeoutMs / 1000} s`);
}

// --- dependencies -------------------------------------------------------------------------

function ensureNodeModules() {
  const marker = path.join(root, "node_modules", ".package-lock.json");
  const lock = path.join(root, "package-lock.json");
  const stale = !fs.existsSync(marker) || fs.statSync(lock).mtimeMs > fs.statSync(marker).mtimeMs;
  if (!stale) return;
  log("installing npm dependencies (npm ci)…");
  run("npm", ["ci", "--no-audit", "--no-fund"]);
}

function aptInstall(packages, why) {
  if (!isRoot) {
    throw new Error(`${why} is missing. Install it with: sudo apt-get install -y ${packages.join(" ")}`);
  }
  log(`installing ${packages.join(", ")} from Debian's packages…`);
  run("apt-get", ["update", "-qq"]);
  run("apt-get", ["install", "-y", "-qq", "--no-install-recommends", ...packages], {
    env: { ...process.env, DEBIAN_FRONTEND: "noninteractive" },
  });
}

function findPgBin() {
  const base = "/usr/lib/postgresql";
  if (!fs.existsSync(base)) return null;
  const versions = fs
    .readdirSync(base)
    .filter((v) => fs.existsSync(path.join(base, v, "bin", "initdb")))
    .sort((a, b) => Number(b) - Number(a));
  return versions.length ? path.join(base, versions[0], "bin") : null;
}

function ensurePostgresInstalled() {
  let bin = findPgBin();
  if (!bin) {
    aptInstall(["postgresql"], "The PostgreSQL server");
    bin = findPgBin();
    if (!bin) throw new Error("PostgreSQL was installed but initdb was not found under /usr/lib/postgresql");
  }
  return bin;
}

export function ensureChromium() {
  if (fs.existsSync("/usr/bin/chromium")) return "/usr/bin/chromium";
  aptInstall(["chromium", "fonts-liberation"], "Chromium (for the browser tests)");
  return "/usr/bin/chromium";
}

// --- PostgreSQL ---------------------------------------------------------------------------

// As root, initdb refuses to run, so the cluster belongs to the "postgres" system user.
function asPgUser(args) {
  return isRoot ? ["runuser", ["-u", "postgres", "--", ...args]] : [args[0], args.slice(1)];
}

function pgRun(args, opts = {}) {
  const [cmd, rest] = asPgUser(args);
  const res = spawnSync(cmd, rest, { cwd: "/", encoding: "utf8", ...opts });
  return res;
}

function makeTraversable(dir) {
  // The postgres user must be able to reach the data dir; open the execute bit on any
  // parent that blocks it (e.g. a clone under /root). Only the search bit is added.
  const parts = path.resolve(dir).split(path.sep).filter(Boolean);
  let current = "/";
  for (const part of parts) {
    current = path.join(current, part);
    if (!fs.existsSync(current)) break;
    const mode = fs.statSync(current).mode;
    if ((mode & 0o001) === 0) fs.chmodSync(current, mode | 0o001);
  }
}

async function startPostgres(pgBin, dataDir, port, { fast }) {
  if (isRoot) {
    spawnSync("id", ["-u", "postgres"]).status === 0 ||
      run("useradd", ["--system", "--home-dir", "/var/lib/postgresql", "--shell", "/bin/bash", "postgres"]);
  }
  fs.mkdirSync(dataDir, { recursive: true });
  if (isRoot) {
    makeTraversable(path.dirname(dataDir));
    execFileSync("chown", ["-R", "postgres:postgres", dataDir]);
  }
  fs.chmodSync(dataDir, 0o700);
  if (!fs.existsSync(path.join(dataDir, "PG_VERSION"))) {
    log(`creating a PostgreSQL cluster in ${path.relative(root, dataDir) || dataDir}…`);
    const res = pgRun([
      path.join(pgBin, "initdb"),
      "-D", dataDir, "-U", "postgres", "--auth=trust", "--encoding=UTF8", "--locale=C.UTF-8",
    ]);
    if (res.status !== 0) throw new Error(`initdb failed:\n${res.stdout}\n${res.stderr}`);
  }
  const options = [
    "-c", "listen_addresses=127.0.0.1",
    "-c", `port=${port}`,
    "-c", "unix_socket_directories=",
    ...(fast ? ["-c", "fsync=off", "-c", "synchronous_commit=off", "-c", "full_page_writes=off"] : []),
  ];
  const logFile = path.join(dataDir, "server.log");
  const res = pgRun([path.join(pgBin, "pg_ctl"), "-D", dataDir, "-l", logFile, "-w", "-t", "60", "-o", options.map(quoteOpt).join(" "), "start"]);
  if (res.status !== 0) {
    const tail = fs.existsSync(logFile) ? fs.readFileSync(logFile, "utf8").split("\n").slice(-15).join("\n") : "";
    throw new Error(`PostgreSQL did not start on 127.0.0.1:${port}:\n${res.stderr}\n${tail}`);
  }
  pg = { pgBin, dataDir };
  log(`PostgreSQL listening on 127.0.0.1:${port}`);
}

function quoteOpt(o) {
  return o.endsWith("=") ? `${o}''` : o;
}

function stopPostgres() {
  if (!pg) return;
  pgRun([path.join(pg.pgBin, "pg_ctl"), "-D", pg.dataDir, "-m", "fast", "-w", "stop"]);
  pg = null;
}

// --- child processes ----------------------------------------------------------------------

function startChild(name, cmd, args, env, { quiet = false } = {}) {
  const child = spawn(cmd, args, {
    cwd: root,
    env,
    detached: true,
    stdio: quiet ? ["ignore", "ignore", "inherit"] : "inherit",
  });
  child.on("exit", (code, signal) => {
    if (!stopping) {
      process.stderr.write(`[ordwise] ${name} stopped unexpectedly (${signal ?? code})\n`);
      shutdown(1);
    }
  });
  children.push({ name, child });
  return child;
}

function killChildren() {
  for (const { child } of children.reverse()) {
    if (child.exitCode === null && child.signalCode === null) {
      try {
        process.kill(-child.pid, "SIGTERM");
      } catch {
        /* already gone */
      }
    }
  }
}

let lockFile = null;
function shutdown(code) {
  if (stopping) return;
  stopping = true;
  killChildren();
  stopPostgres();
  if (lockFile) fs.rmSync(lockFile, { force: true });
  process.exit(code);
}

process.on("SIGINT", () => {
  log("stopping…");
  shutdown(0);
});
process.on("SIGTERM", () => shutdown(0));

const tsx = () => path.join(root, "node_modules", ".bin", "tsx");
const next = () => path.join(root, "node_modules", ".bin", "next");

// --- the stack ----------------------------------------------------------------------------

async function bringUp({ dataDir, ports, fast }) {
  ensureNodeModules();
  // The analysis command line is bundled once (dist/cli/), so `npm run analyze` starts fast.
  run(process.execPath, ["scripts/build-cli.mjs"]);
  const pgBin = ensurePostgresInstalled();
  await startPostgres(pgBin, path.join(dataDir, "pg"), ports.pg, { fast });

  const appUrl = `http://127.0.0.1:${ports.app}`;
  const env = {
    ...process.env,
    DATABASE_URL: `postgres://postgres@127.0.0.1:${ports.pg}/ordwise`,
    S3_ENDPOINT: `http://127.0.0.1:${ports.s3}`,
    S3_BUCKET: "ordwise-captures",
    S3_DIR: path.join(dataDir, "s3"),
    SMTP_HOST: "127.0.0.1",
    SMTP_PORT: String(ports.smtp),
    MAIL_CATCHER_URL: `http://127.0.0.1:${ports.mailHttp}`,
    MAIL_CATCHER_HTTP_PORT: String(ports.mailHttp),
    MAIL_FROM: "Ordwise <no-reply@ordwise.test>",
    APP_URL: appUrl,
    PORT: String(ports.app),
    NEXT_TELEMETRY_DISABLED: "1",
  };

  log("applying migrations and seeding…");
  run(tsx(), ["scripts/setup-db.ts"], { env });

  startChild("s3rver + mail catcher", tsx(), ["scripts/services.ts"], env);
  await waitForPort(ports.s3, "s3rver");
  await waitForPort(ports.mailHttp, "the mail catcher");
  run(tsx(), ["--conditions=react-server", "scripts/seed-demo.ts"], { env });
  return { env, appUrl };
}

async function serveApp(env, { dev = false, quiet = false, processes } = {}) {
  if (!dev) {
    log("building the app (next build)…");
    // next build adds its dist dir's type folders to tsconfig.json; a test build's temporary
    // dir must not end up there, so the file is put back as it was.
    const tsconfigPath = path.join(root, "tsconfig.json");
    const tsconfig = fs.readFileSync(tsconfigPath, "utf8");
    run(next(), ["build"], { env: { ...env, NODE_ENV: "production" }, stdio: quiet ? ["ignore", "ignore", "inherit"] : "inherit" });
    if (process.env.NEXT_DIST_DIR) fs.writeFileSync(tsconfigPath, tsconfig);
  }
  // Next.js processes sharing the port (scripts/serve.mjs; WEB_PROCESSES chooses); one in development.
  const serve = ["scripts/serve.mjs", ...(dev ? ["--dev"] : [])];
  startChild("the web app", process.execPath, serve, { ...env, HOST: "127.0.0.1", NODE_ENV: dev ? "development" : "production", ...(processes ? { WEB_PROCESSES: processes } : {}) }, { quiet });
  startChild("the analysis worker", tsx(), ["--conditions=react-server", "scripts/worker.ts"], { ...env, NODE_ENV: "production" }, { quiet });
  await waitForPort(Number(env.PORT), "the web app", 120_000);
}

async function start(dev) {
  const dataDir = path.join(root, ".data");
  fs.mkdirSync(dataDir, { recursive: true });
  lockFile = path.join(dataDir, "ordwise.pid");
  if (fs.existsSync(lockFile)) {
    const pid = Number(fs.readFileSync(lockFile, "utf8"));
    let alive = false;
    try {
      process.kill(pid, 0);
      alive = true;
    } catch {
      /* stale lock */
    }
    if (alive) {
      lockFile = null;
      fail(`Ordwise is already running (pid ${pid}) at http://127.0.0.1:3000 — stop it with Ctrl-C in its terminal first.`);
      return;
    }
  }
  fs.writeFileSync(lockFile, String(process.pid));
  const ports = { pg: 54320, s3: 4569, smtp: 2525, mailHttp: 2580, app: 3000 };
  for (const [name, port] of Object.entries(ports)) {
    if (await portInUse(port)) {
      fail(`port ${port} (${name}) on 127.0.0.1 is already in use by another program; free it and run npm start again.`);
      return;
    }
  }
  const { env, appUrl } = await bringUp({ dataDir, ports, fast: false });
  await serveApp(env, { dev });
  log("");
  log(`Ordwise is running at ${appUrl}`);
  log("Demo sign-ins (password for all: ordwise-demo-2026):");
  for (const who of ["admin", "engineer", "technician", "viewer"]) log(`  ${who.padEnd(11)} ${who}@ordwise.test`);
  log(`Mail catcher (dev only): ${appUrl}/dev/mailbox (as admin)`);
  log("Press Ctrl-C to stop everything.");
}

async function test() {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), "ordwise-test-"));
  const distDir = `.next-test/${path.basename(dataDir)}`;
  process.env.NEXT_DIST_DIR = distDir;
  const ports = { pg: await freePort(), s3: await freePort(), smtp: await freePort(), mailHttp: await freePort(), app: await freePort() };
  let failedRuns = 0;
  const totals = { passed: 0, failed: 0, skipped: 0 };
  try {
    ensureNodeModules();
    log("type-checking the whole tree (tsc --noEmit)…");
    const tsc = process.env.SKIP_TYPECHECK
      ? { status: 0 }
      : spawnSync(path.join(root, "node_modules", ".bin", "tsc"), ["--noEmit"], { cwd: root, stdio: "inherit" });
    if (tsc.status !== 0) {
      failedRuns += 1;
      totals.failed += 1;
      throw new Error("the type check failed (see above)");
    }
    const chromium = ensureChromium();
    const { env } = await bringUp({ dataDir, ports, fast: true });
    // Two web processes whatever the machine, so that anything one process kept to itself would show.
    await serveApp(env, { quiet: true, processes: process.env.WEB_PROCESSES ?? "2" });
    const testEnv = { ...env, CHROMIUM_PATH: chromium, TEST_DATA_DIR: dataDir };
    // Developers may narrow a run while iterating: `TEST_PROJECTS=integration npm test -- tests/integration/x.test.ts`.
    // CI sets neither, so it always runs every project and every file.
    const projects = (process.env.TEST_PROJECTS ?? "unit,integration,e2e").split(",").filter(Boolean);
    const filters = process.argv.slice(3);
    for (const project of projects) {
      log(`running the ${project} tests…`);
      const report = path.join(dataDir, `vitest-${project}.json`);
      const res = spawnSync(
        path.join(root, "node_modules", ".bin", "vitest"),
        [
          "run",
          "--project",
          project,
          "--reporter=default",
          "--reporter=json",
          `--outputFile.json=${report}`,
          ...(filters.length > 0 ? ["--passWithNoTests", ...filters] : []),
        ],
        { cwd: root, stdio: "inherit", env: testEnv },
      );
      if (res.status !== 0) failedRuns += 1;
      if (fs.existsSync(report)) {
        const json = JSON.parse(fs.readFileSync(report, "utf8"));
        totals.passed += json.numPassedTests ?? 0;
        totals.failed += json.numFailedTests ?? 0;
        totals.skipped += (json.numPendingTests ?? 0) + (json.numTodoTests ?? 0);
      } else if (res.status !== 0) {
        totals.failed += 1;
      }
    }
  } catch (err) {
    process.stderr.write(`[ordwise] ${err.message}\n`);
    failedRuns += 1;
  }
  process.stdout.write(`\n${totals.passed} passed, ${totals.failed} failed, ${totals.skipped} skipped\n`);
  stopping = true;
  killChildren();
  stopPostgres();
  fs.rmSync(path.join(root, distDir), { recursive: true, force: true });
  if (!process.env.KEEP_TEST_DATA) fs.rmSync(dataDir, { recursive: true, force: true });
  process.exit(failedRuns === 0 && totals.failed === 0 ? 0 : 1);
}

try {
  if (mode === "test") await test();
  else if (mode === "start" || mode === "dev") await start(mode === "dev");
  else fail(`unknown mode "${mode}" (use start, dev or test)`);
} catch (err) {
  fail(err instanceof Error ? err.message : String(err));
}
