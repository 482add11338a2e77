/**
 * A small pool of worker threads for `analyze`: heavy DSP never runs on the event loop that answers
 * requests or renews pg-boss leases. Threads start lazily and are replaced when one dies.
 */
import { createRequire } from "node:module";
import path from "node:path";
import { pathToFileURL } from "node:url";
import { Worker } from "node:worker_threads";
import type { AnalysisReport } from "../../shared/dsp/analysis";
import type { ThreadReply } from "./thread-protocol";

/** An analysis the DSP refused (bad spec, input out of range): retrying cannot help. */
export class AnalysisRejected extends Error {
  constructor(message: string) {
    super(message);
    this.name = "AnalysisRejected";
  }
}

interface Task {
  id: number;
  spec: unknown;
  onProgress: (fraction: number, stage: string) => void;
  resolve: (r: AnalysisReport) => void;
  reject: (e: Error) => void;
}

interface Slot {
  worker: Worker;
  task: Task | null;
}

const THREAD_URL = new URL("./analysis-thread.ts", import.meta.url).href;
// tsx's ESM API file (its CommonJS twin cannot load the ESM half); tsx is pinned in package.json.
const TSX_API = pathToFileURL(
  path.join(
    path.dirname(createRequire(import.meta.url).resolve("tsx/package.json")),
    "dist/esm/api/index.mjs",
  ),
).href;

// Node 20 does not apply `--import tsx` hooks to a worker's entry file, so the thread starts from a line of
// JavaScript that loads the TypeScript entry through tsx's API (works under npm start, npm run worker and vitest).
const BOOT = `import(${JSON.stringify(TSX_API)}).then(({ tsImport }) => tsImport(${JSON.stringify(THREAD_URL)}, ${JSON.stringify(THREAD_URL)}))`;

/** A fixed-size pool; `run` queues when every thread is busy. */
export class AnalysisThreadPool {
  private readonly slots: Slot[] = [];
  private readonly waiting: Task[] = [];
  private nextId = 1;
  private closed = false;

  constructor(readonly size: number) {
    if (!Number.isInteger(size) || size < 1)
      throw new RangeError(`pool size must be a positive integer, got ${size}`);
  }

  /** Analyse `spec` in a thread; progress arrives as the DSP core reports it. */
  run(
    spec: unknown,
    onProgress: (fraction: number, stage: string) => void = () => {},
  ): Promise<AnalysisReport> {
    if (this.closed) return Promise.reject(new Error("the analysis thread pool is closed"));
    return new Promise((resolve, reject) => {
      this.waiting.push({ id: this.nextId++, spec, onProgress, resolve, reject });
      this.dispatch();
    });
  }

  /** Stop every thread; running tasks are rejected. */
  async close(): Promise<void> {
    this.closed = true;
    for (const t of this.waiting.splice(0)) t.reject(new Error("the analysis thread pool closed"));
    await Promise.all(this.slots.splice(0).map((s) => s.worker.terminate()));
  }

  private dispatch(): void {
    while (this.waiting.length > 0) {
      let slot = this.slots.find((s) => s.task === null);
      if (!slot && this.slots.length < this.size) slot = this.spawn();
      if (!slot) return;
      const task = this.waiting.shift()!;
      slot.task = task;
      slot.worker.postMessage({ id: task.id, spec: task.spec });
    }
  }

  private spawn(): Slot {
    const worker = new Worker(BOOT, { eval: true });
    const slot: Slot = { worker, task: null };
    worker.on("message", (m: ThreadReply) => {
      const task = slot.task;
      if (!task || task.id !== m.id) return;
      if (m.type === "progress") {
        task.onProgress(m.fraction, m.stage);
        return;
      }
      slot.task = null;
      if (m.type === "done") task.resolve(m.report);
      else task.reject(new AnalysisRejected(m.message));
      this.dispatch();
    });
    const lost = (err: Error) => {
      const i = this.slots.indexOf(slot);
      if (i >= 0) this.slots.splice(i, 1);
      const task = slot.task;
      slot.task = null;
      task?.reject(err);
      if (!this.closed) this.dispatch();
    };
    worker.on("error", (err) => lost(new Error(`the analysis thread failed: ${err.message}`)));
    worker.on("exit", (code) => lost(new Error(`the analysis thread exited (code ${code})`)));
    // An idle pool must not keep a process alive on its own.
    worker.unref();
    this.slots.push(slot);
    return slot;
  }
}
