import { existsSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import type { Worker as WorkerType } from "node:worker_threads";
import type { Job, JobOutput } from "./analysis-job";
import { projectRoot } from "./project-root";
import { JobError, type SerialisedJobError } from "./job-errors";

/**
 * A small pool of worker threads running decode + analysis, so a 3000×3000 image never blocks the server's event
 * loop. Jobs queue when every worker is busy; a job running longer than the timeout terminates its worker.
 */
const JOB_TIMEOUT_MS = 120_000;

type Pending = { resolve: (o: JobOutput) => void; reject: (e: Error) => void; timer: NodeJS.Timeout };
interface Slot {
  worker: WorkerType;
  busy: boolean;
  current: { id: number; pending: Pending } | null;
}

/**
 * The Worker constructor, fetched at run time: bundlers treat a literal `new Worker(path)` as a bundling entry point
 * and try to pull the project into the server bundle. The worker code is bundled separately (scripts/build-worker.mjs).
 */
function workerConstructor(): typeof WorkerType {
  const threads = (process as unknown as { getBuiltinModule(id: string): typeof import("node:worker_threads") }).getBuiltinModule("node:worker_threads");
  return threads.Worker;
}

function workerPath(): string {
  const p = process.env.HALFMAX_WORKER_PATH ?? path.join(projectRoot(), "dist", "analysis-worker.mjs");
  if (!existsSync(p)) throw new Error(`analysis worker bundle not found at ${p}: run "npm run build:worker"`);
  return p;
}

class WorkerPool {
  private slots: Slot[] = [];
  private queue: { id: number; job: Job; pending: Pending }[] = [];
  private nextId = 1;
  constructor(private readonly size: number) {}

  run(job: Job): Promise<JobOutput> {
    return new Promise<JobOutput>((resolve, reject) => {
      const id = this.nextId++;
      const pending: Pending = { resolve, reject, timer: undefined as unknown as NodeJS.Timeout };
      this.queue.push({ id, job, pending });
      this.pump();
    });
  }

  private spawn(): Slot {
    const WorkerCtor = workerConstructor();
    const slot: Slot = { worker: new WorkerCtor(workerPath()), busy: false, current: null };
    slot.worker.unref();
    slot.worker.on("message", (msg: { id: number; ok: boolean; output?: JobOutput; error?: SerialisedJobError }) => {
      const cur = slot.current;
      if (!cur || cur.id !== msg.id) return;
      clearTimeout(cur.pending.timer);
      slot.current = null;
      slot.busy = false;
      if (msg.ok) cur.pending.resolve(msg.output!);
      else cur.pending.reject(new JobError(msg.error!));
      this.pump();
    });
    const fail = (err: Error) => {
      const cur = slot.current;
      this.slots = this.slots.filter((s) => s !== slot);
      if (cur) {
        clearTimeout(cur.pending.timer);
        cur.pending.reject(err);
      }
      this.pump();
    };
    slot.worker.on("error", fail);
    slot.worker.on("exit", (code) => {
      if (slot.current) fail(new Error(`analysis worker exited with code ${code}`));
      else this.slots = this.slots.filter((s) => s !== slot);
    });
    this.slots.push(slot);
    return slot;
  }

  private pump(): void {
    while (this.queue.length) {
      let slot = this.slots.find((s) => !s.busy);
      if (!slot && this.slots.length < this.size) slot = this.spawn();
      if (!slot) return;
      const item = this.queue.shift()!;
      slot.busy = true;
      slot.current = { id: item.id, pending: item.pending };
      const theSlot = slot;
      item.pending.timer = setTimeout(() => {
        void theSlot.worker.terminate();
        item.pending.reject(new JobError({ name: "Error", code: "timeout", message: `analysis took longer than ${JOB_TIMEOUT_MS / 1000} s and was stopped` }));
      }, JOB_TIMEOUT_MS);
      // Copy the bytes so the caller keeps its buffer (it may still store it); the copy is transferred.
      const bytes = item.job.bytes.slice();
      theSlot.worker.postMessage({ id: item.id, job: { ...item.job, bytes } }, [bytes.buffer as ArrayBuffer]);
    }
  }
}

const globalForPool = globalThis as unknown as { halfmaxWorkerPool?: WorkerPool };

/** Run a decode/analysis job on the shared pool (size: cores − 1, at least 1; HALFMAX_WORKERS overrides). */
export function runInWorker(job: Job): Promise<JobOutput> {
  if (!globalForPool.halfmaxWorkerPool) {
    const size = Number(process.env.HALFMAX_WORKERS ?? Math.max(1, os.availableParallelism() - 1));
    globalForPool.halfmaxWorkerPool = new WorkerPool(size);
  }
  return globalForPool.halfmaxWorkerPool.run(job);
}
