// `npm run analyze`: runs the bundled command line (dist/analyze.mjs), building it first when it is
// missing or stale (scripts/build-cli.mjs). The command line itself is scripts/analyze.ts.
import { buildCli, bundlePath, cliBundleIsStale, startHelperPath } from "./build-cli.mjs";
import { pathToFileURL } from "node:url";
import v8 from "node:v8";

// A short run that reads a large file once: its arithmetic runs cold (interpreted) until V8 has
// compiled it. Compiling a hot loop on this thread at once (rather than in the background while
// the interpreter goes on) and keeping the young generation at its first size (more, cheaper
// scavenges instead of mapping fresh pages for it) measurably cut CPU time and page faults
// (`npm run bench -- cli-60s-4ch-25k6`). Neither changes any result.
v8.setFlagsFromString("--no-concurrent-osr");
v8.setFlagsFromString("--semi-space-growth-factor=1");
// Type feedback from a function's first call on (not only once it has been called a few times): the
// checks' loops run their stores once on no rows before the first chunk (e.g. ChannelScan), so the
// loop compiled while the first chunk runs knows them and is not thrown out after every chunk.
v8.setFlagsFromString("--no-lazy-feedback-allocation");

if (cliBundleIsStale()) await buildCli();
// The analysis helper thread (when a core is free for it) is started first, from a small module, so
// that its start-up and warming up overlap loading the command line.
const { startAnalysisHelper } = await import(pathToFileURL(startHelperPath).href);
const helper = startAnalysisHelper(process.argv.slice(2));
const { main } = await import(pathToFileURL(bundlePath).href);
const code = await main(process.argv.slice(2), { helper });
// Everything is written (stdout and stderr write synchronously to files and pipes on Linux): exit at
// once rather than wait for the runtime to free the heap. With a write still pending, end as usual.
if (process.stdout.writableLength === 0 && process.stderr.writableLength === 0) process.exit(code);
process.exitCode = code;
