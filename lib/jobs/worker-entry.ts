// Entry of the analysis worker thread (bundled to dist/analysis-worker.mjs by scripts/build-worker.mjs).
import { parentPort } from "node:worker_threads";
import { runJob, type Job } from "./analysis-job";
import { serialiseError } from "./job-errors";

if (!parentPort) throw new Error("analysis worker must run in a worker thread");
const port = parentPort;

port.on("message", (message: { id: number; job: Job }) => {
  try {
    const output = runJob(message.job);
    const transfer = output.kind === "preview" ? [output.data.buffer as ArrayBuffer] : [];
    port.postMessage({ id: message.id, ok: true, output }, transfer);
  } catch (err) {
    port.postMessage({ id: message.id, ok: false, error: serialiseError(err) });
  }
});
