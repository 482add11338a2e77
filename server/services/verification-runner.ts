/**
 * Runs a comparison: inline for small files, in a worker thread of its own for large ones, so parsing a
 * 50 MB upload never stalls the requests the event loop is answering.
 */
import { createRequire } from "node:module";
import path from "node:path";
import { pathToFileURL } from "node:url";
import { Worker } from "node:worker_threads";
import { runCompareTask, SampleParseError, type CompareTask, type Comparison } from "./verification-compare";

/** Above this many bytes (upload + expected output) the comparison runs in a worker thread. */
export const INLINE_COMPARE_BYTES = 256 * 1024;

const THREAD_URL = new URL("./verification-thread.ts", import.meta.url).href;
// Same start-up as the analysis pool (server/jobs/thread-pool.ts): Node 20 applies no `--import tsx`
// hooks to a worker's entry file, so a line of JavaScript loads the TypeScript entry through tsx's API.
const TSX_API = pathToFileURL(
  path.join(
    path.dirname(createRequire(import.meta.url).resolve("tsx/package.json")),
    "dist/esm/api/index.mjs",
  ),
).href;
const BOOT = `import(${JSON.stringify(TSX_API)}).then(({ tsImport }) => tsImport(${JSON.stringify(THREAD_URL)}, ${JSON.stringify(THREAD_URL)}))`;

type Reply =
  | { type: "done"; result: Comparison }
  | { type: "parse-error"; message: string; line: number; column: number }
  | { type: "error"; message: string };

/** Compare in a fresh worker thread; it ends with the answer. */
export function compareInThread(task: CompareTask): Promise<Comparison> {
  return new Promise((resolve, reject) => {
    const worker = new Worker(BOOT, { eval: true });
    let settled = false;
    const finish = (f: () => void) => {
      if (settled) return;
      settled = true;
      f();
      void worker.terminate();
    };
    worker.on("message", (m: Reply) =>
      finish(() => {
        if (m.type === "done") resolve(m.result);
        else if (m.type === "parse-error") {
          // The thread's message already starts with "line L, column C: "; keep only the reason.
          const reason = m.message.replace(/^line \d+, column \d+: /, "");
          reject(new SampleParseError(reason, m.line, m.column));
        } else reject(new Error(m.message));
      }),
    );
    worker.on("error", (err) => finish(() => reject(err)));
    worker.on("exit", (code) =>
      finish(() => reject(new Error(`the comparison thread exited (code ${code})`))),
    );
    worker.postMessage(task);
  });
}

/** Compare inline when small, else in a worker thread (`thread` forces either, for tests). */
export function compare(task: CompareTask, thread?: boolean): Promise<Comparison> {
  const big = task.upload.byteLength + task.expected.byteLength > INLINE_COMPARE_BYTES;
  if (thread ?? big) return compareInThread(task);
  try {
    return Promise.resolve(runCompareTask(task));
  } catch (e) {
    return Promise.reject(e as Error);
  }
}
