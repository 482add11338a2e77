/**
 * A small pool of worker threads for the CPU-heavy parts of requests (server/jobs/cpu-tasks.ts): parsing an
 * upload, bcrypt, template previews, release bundles. Two lanes, so a sign-in never queues behind a
 * bundle build: `interactive` (short tasks) and `bundle` (one build at a time). Threads start lazily, are
 * replaced when one dies, and never keep the process alive on their own.
 */
import { createRequire } from "node:module";
import os from "node:os";
import path from "node:path";
import { pathToFileURL } from "node:url";
import { Worker } from "node:worker_threads";
import { CoefficientParseError } from "../../shared/coefficients/parse";
import { BundleBuildError } from "../bundles/build";
import { TemplateError } from "../exports/engine";
import { MaterializeError } from "../services/materialize";
import type { CpuTasks } from "./cpu-tasks";

type TaskName = keyof CpuTasks;
type Arg<K extends TaskName> = Parameters<CpuTasks[K]>[0];
type Result<K extends TaskName> = Awaited<ReturnType<CpuTasks[K]>>;

interface Job {
  id: number;
  task: TaskName;
  arg: unknown;
  transfer: ArrayBuffer[];
  resolve: (v: unknown) => void;
  reject: (e: Error) => void;
}

interface Slot {
  worker: Worker;
  job: Job | null;
}

interface WireError {
  name: string;
  message: string;
  fields: Record<string, unknown>;
}

/** Rebuild the error a task threw, as its own class where the callers test for one. */
function revive(e: WireError): Error {
  const f = e.fields;
  if (e.name === "CoefficientParseError") {
    const err = new CoefficientParseError("", Number(f.line ?? 0), Number(f.column ?? 0));
    err.message = e.message;
    return err;
  }
  if (e.name === "TemplateError")
    return new TemplateError(
      e.message,
      (f.line as number | null) ?? null,
      (f.column as number | null) ?? null,
    );
  if (e.name === "BundleBuildError") return new BundleBuildError(e.message);
  if (e.name === "MaterializeError")
    return new MaterializeError(e.message, Array.isArray(f.path) ? (f.path as (string | number)[]) : []);
  const err = e.name === "RangeError" ? new RangeError(e.message) : new Error(e.message);
  Object.assign(err, f);
  return err;
}

const THREAD_URL = new URL("./cpu-thread.ts", import.meta.url).href;
const TSX_API = pathToFileURL(
  path.join(
    path.dirname(createRequire(import.meta.url).resolve("tsx/package.json")),
    "dist/esm/api/index.mjs",
  ),
).href;
// As in thread-pool.ts: Node 20 does not apply `--import tsx` to a worker's entry, so boot through tsx's API.
const BOOT = `import(${JSON.stringify(TSX_API)}).then(({ tsImport }) => tsImport(${JSON.stringify(THREAD_URL)}, ${JSON.stringify(THREAD_URL)}))`;

/** Options of one lane. */
export interface CpuLaneOptions {
  threads: number;
  /** Heap cap of each thread (MiB); a task past it fails with a clear error instead of taking the machine. */
  maxHeapMb?: number;
}

/** One lane: a fixed number of threads and a FIFO queue. */
export class CpuLane {
  private readonly slots: Slot[] = [];
  private readonly waiting: Job[] = [];
  private nextId = 1;
  private closed = false;

  constructor(private readonly opts: CpuLaneOptions) {}

  /** Jobs waiting or running. */
  get load(): number {
    return this.waiting.length + this.slots.filter((s) => s.job).length;
  }

  /** Run a task in a thread of this lane. */
  run<K extends TaskName>(task: K, arg: Arg<K>, transfer: ArrayBuffer[] = []): Promise<Result<K>> {
    if (this.closed) return Promise.reject(new Error("the CPU thread pool is closed"));
    return new Promise((resolve, reject) => {
      this.waiting.push({
        id: this.nextId++,
        task,
        arg,
        transfer,
        resolve: resolve as (v: unknown) => void,
        reject,
      });
      this.dispatch();
    });
  }

  /** Stop every thread; waiting and running tasks are rejected. */
  async close(): Promise<void> {
    this.closed = true;
    for (const j of this.waiting.splice(0)) j.reject(new Error("the CPU thread pool closed"));
    await Promise.all(this.slots.splice(0).map((s) => s.worker.terminate()));
  }

  private dispatch(): void {
    while (this.waiting.length > 0) {
      let slot = this.slots.find((s) => s.job === null);
      if (!slot && this.slots.length < this.opts.threads) slot = this.spawn();
      if (!slot) return;
      const job = this.waiting.shift()!;
      slot.job = job;
      // A busy thread keeps the process alive (a script awaiting a hash must not exit); an idle one does not.
      slot.worker.ref();
      slot.worker.postMessage({ id: job.id, task: job.task, arg: job.arg }, job.transfer);
    }
  }

  private spawn(): Slot {
    const worker = new Worker(BOOT, {
      eval: true,
      resourceLimits: this.opts.maxHeapMb ? { maxOldGenerationSizeMb: this.opts.maxHeapMb } : undefined,
    });
    const slot: Slot = { worker, job: null };
    worker.on(
      "message",
      (m: { id: number; ok: true; value: unknown } | { id: number; ok: false; error: WireError }) => {
        const job = slot.job;
        if (!job || job.id !== m.id) return;
        slot.job = null;
        slot.worker.unref();
        if (m.ok) job.resolve(m.value);
        else job.reject(revive(m.error));
        this.dispatch();
      },
    );
    const lost = (err: Error) => {
      const i = this.slots.indexOf(slot);
      if (i >= 0) this.slots.splice(i, 1);
      const job = slot.job;
      slot.job = null;
      job?.reject(err);
      if (!this.closed) this.dispatch();
    };
    worker.on("error", (err) => {
      const oom = (err as { code?: string }).code === "ERR_WORKER_OUT_OF_MEMORY";
      lost(
        new Error(
          oom
            ? `the work ran out of its memory budget (${this.opts.maxHeapMb} MiB of heap per thread)`
            : `a CPU thread failed: ${err.message}`,
        ),
      );
    });
    worker.on("exit", (code) => lost(new Error(`a CPU thread exited (code ${code})`)));
    worker.unref();
    this.slots.push(slot);
    return slot;
  }
}

/** The two lanes of the process. */
export interface CpuPool {
  interactive: CpuLane;
  bundle: CpuLane;
  /** Run a short task on the interactive lane. */
  run<K extends TaskName>(task: K, arg: Arg<K>, transfer?: ArrayBuffer[]): Promise<Result<K>>;
}

let shared: CpuPool | undefined;

/** The process's CPU pool (created on first use): up to 2 interactive threads and 1 bundle thread. */
export function cpuPool(): CpuPool {
  if (!shared) {
    const interactive = new CpuLane({ threads: Math.max(1, Math.min(2, os.availableParallelism())) });
    const bundle = new CpuLane({ threads: 1, maxHeapMb: 4096 });
    shared = {
      interactive,
      bundle,
      run: (task, arg, transfer) => interactive.run(task, arg, transfer),
    };
  }
  return shared;
}
