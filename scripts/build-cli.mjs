// Bundles the analysis command line once (scripts/analyze.ts → dist/cli/analyze.mjs plus lazily
// loaded chunks, the analysis helper thread it starts → dist/cli/analysis-helper-thread.mjs, and the
// small module that starts it → dist/cli/start-analysis-helper.mjs) so `npm run analyze` starts
// without transpiling TypeScript on every run.
// Run by `npm start`/`npm test` (scripts/stack.mjs) and by scripts/analyze.mjs when the bundle is
// missing or older than any file it was built from.
//   node scripts/build-cli.mjs            build when stale
//   node scripts/build-cli.mjs --force    build always
import fs from "node:fs";
import path from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const outDir = path.join(root, "dist", "cli");
export const bundlePath = path.join(outDir, "analyze.mjs");
const helperPath = path.join(outDir, "analysis-helper-thread.mjs");
/** The small module scripts/analyze.mjs starts the helper thread from (scripts/start-analysis-helper.ts). */
export const startHelperPath = path.join(outDir, "start-analysis-helper.mjs");
const inputsPath = path.join(outDir, "inputs.json");

/** True when the bundle is missing or any of its inputs (or the lock file, or this script) changed after it was built. */
export function cliBundleIsStale() {
  let built;
  let inputs;
  try {
    built = fs.statSync(bundlePath).mtimeMs;
    inputs = JSON.parse(fs.readFileSync(inputsPath, "utf8"));
  } catch {
    return true;
  }
  for (const file of [...inputs, "package-lock.json", "scripts/build-cli.mjs"]) {
    try {
      if (fs.statSync(path.join(root, file)).mtimeMs > built) return true;
    } catch {
      return true; // an input was deleted or moved
    }
  }
  return false;
}

// zod re-exports all of its ~40 message locales (340 KB) through `z.locales`; the product uses only
// the English one zod installs by default, so the others stay out of the bundle (faster start-up).
const englishZodLocaleOnly = {
  name: "english-zod-locale-only",
  setup(build) {
    build.onResolve({ filter: /locales\/index\.js$/ }, (args) =>
      args.importer.includes(`${path.sep}zod${path.sep}`) ? { path: path.join(path.dirname(args.importer), "../locales/en.js"), namespace: "zod-en" } : undefined,
    );
    build.onLoad({ filter: /.*/, namespace: "zod-en" }, (args) => ({ contents: `export { default as en } from ${JSON.stringify(args.path)};`, resolveDir: path.dirname(args.path) }));
  },
};

/**
 * Builds the bundle. Chunks have content-hashed names and are written first; the entry is written
 * beside and renamed last, so a concurrent run never sees half a bundle.
 */
export async function buildCli() {
  const { build } = await import("esbuild");
  const result = await build({
    absWorkingDir: root,
    // The command line, and the analysis helper thread it starts (lib/analysis/analysis-helper.ts) beside it.
    entryPoints: {
      analyze: "scripts/analyze.ts",
      "analysis-helper-thread": "lib/analysis/analysis-helper-thread.ts",
      "start-analysis-helper": "scripts/start-analysis-helper.ts",
    },
    outdir: outDir,
    outExtension: { ".js": ".mjs" },
    chunkNames: "chunk-[hash]",
    bundle: true,
    splitting: true,
    write: false,
    platform: "node",
    format: "esm",
    target: "node20",
    // server-only resolves to its empty module, as for the worker (tsx --conditions=react-server).
    conditions: ["react-server"],
    tsconfig: "tsconfig.json",
    metafile: true,
    minifyWhitespace: true,
    minifySyntax: true,
    legalComments: "none",
    logLevel: "warning",
    plugins: [englishZodLocaleOnly],
    // CommonJS packages inside an ES module bundle need require.
    banner: { js: "import { createRequire as __ordwiseCreateRequire } from 'node:module'; const require = __ordwiseCreateRequire(import.meta.url);" },
  });
  fs.mkdirSync(outDir, { recursive: true });
  const entry = result.outputFiles.find((f) => f.path === bundlePath);
  const helper = result.outputFiles.find((f) => f.path === helperPath);
  const startHelper = result.outputFiles.find((f) => f.path === startHelperPath);
  for (const file of result.outputFiles) if (file !== entry && file !== helper && file !== startHelper) fs.writeFileSync(file.path, file.contents);
  const inputs = Object.keys(result.metafile.inputs).filter((f) => !f.startsWith("node_modules/") && !f.includes(":"));
  const tmp = `.${process.pid}.tmp`;
  fs.writeFileSync(inputsPath + tmp, JSON.stringify(inputs));
  fs.writeFileSync(helperPath + tmp, helper.contents);
  fs.writeFileSync(startHelperPath + tmp, startHelper.contents);
  fs.writeFileSync(bundlePath + tmp, entry.contents);
  fs.renameSync(inputsPath + tmp, inputsPath);
  fs.renameSync(helperPath + tmp, helperPath);
  fs.renameSync(startHelperPath + tmp, startHelperPath);
  fs.renameSync(bundlePath + tmp, bundlePath);
  // Chunks of earlier builds that nothing references any more (kept a minute for runs still loading them).
  const current = new Set(result.outputFiles.map((f) => path.basename(f.path)));
  for (const name of fs.readdirSync(outDir)) {
    const file = path.join(outDir, name);
    if (name.startsWith("chunk-") && !current.has(name) && Date.now() - fs.statSync(file).mtimeMs > 60_000) fs.rmSync(file, { force: true });
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  if (process.argv.includes("--force") || cliBundleIsStale()) {
    const started = performance.now();
    await buildCli();
    process.stderr.write(`[ordwise] built ${path.relative(root, bundlePath)} in ${((performance.now() - started) / 1000).toFixed(1)} s\n`);
  }
}
