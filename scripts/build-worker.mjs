// Bundles the analysis worker (lib/jobs/worker-entry.ts and the pure analysis/imaging code) into dist/analysis-worker.mjs.
import { build } from "esbuild";
import path from "node:path";
import { fileURLToPath } from "node:url";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

export async function buildWorker() {
  await build({
    entryPoints: [path.join(root, "lib/jobs/worker-entry.ts")],
    outfile: path.join(root, "dist/analysis-worker.mjs"),
    bundle: true,
    platform: "node",
    target: "node20",
    format: "esm",
    sourcemap: true,
    logLevel: "warning",
    // CommonJS dependencies (dicom-parser, pngjs…) need require() inside an ES module bundle.
    banner: { js: "import { createRequire as __halfmaxCreateRequire } from 'node:module'; const require = __halfmaxCreateRequire(import.meta.url);" },
  });
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  await buildWorker();
  console.log("[halfmax] analysis worker bundled: dist/analysis-worker.mjs");
}
