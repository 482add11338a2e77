/**
 * Worker-thread entry for large verification uploads: parses and compares off the request thread
 * (verification-compare.ts does the work). One message in (a CompareTask), one reply out.
 */
import { parentPort } from "node:worker_threads";
import { runCompareTask, SampleParseError, type CompareTask } from "./verification-compare";

const port = parentPort;
if (!port) throw new Error("verification-thread.ts must run as a worker thread");

port.on("message", (task: CompareTask) => {
  try {
    port.postMessage({ type: "done", result: runCompareTask(task) });
  } catch (e) {
    if (e instanceof SampleParseError)
      port.postMessage({ type: "parse-error", message: e.message, line: e.line, column: e.column });
    else port.postMessage({ type: "error", message: (e as Error).message });
  }
});
