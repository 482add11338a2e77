/**
 * Worker-thread entry: runs the DSP core's `analyze` off the main thread and streams its progress.
 * Messages in: { id, spec }. Out: progress, done (the report) or error (a message a user can act on).
 */
import { parentPort } from "node:worker_threads";
import { analyze } from "../../shared/dsp/analysis";
import type { ThreadReply, ThreadRequest } from "./thread-protocol";
import { describeAnalysisError } from "./thread-protocol";

const port = parentPort;
if (!port) throw new Error("analysis-thread.ts must run as a worker thread");

port.on("message", (msg: ThreadRequest) => {
  const post = (reply: ThreadReply) => port.postMessage(reply);
  try {
    const report = analyze(msg.spec, {
      onProgress: (fraction, stage) => post({ id: msg.id, type: "progress", fraction, stage }),
    });
    post({ id: msg.id, type: "done", report });
  } catch (e) {
    post({ id: msg.id, type: "error", message: describeAnalysisError(e) });
  }
});
