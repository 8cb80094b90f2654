// `npm run analyze`: runs the bundled command line (dist/analyze.mjs), building it first when it is
// missing or stale (scripts/build-cli.mjs). The command line itself is scripts/analyze.ts.
import { buildCli, bundlePath, cliBundleIsStale } from "./build-cli.mjs";
import { pathToFileURL } from "node:url";

if (cliBundleIsStale()) await buildCli();
const { main } = await import(pathToFileURL(bundlePath).href);
process.exitCode = await main(process.argv.slice(2));
