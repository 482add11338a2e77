/**
 * Worker-thread entry of the CPU pool: runs one task of server/jobs/cpu-tasks.ts per message.
 * In: { id, task, arg }. Out: { id, ok: true, value } or { id, ok: false, error } (name, message, fields).
 */
import { parentPort } from "node:worker_threads";
import { cpuTasks } from "./cpu-tasks";

const port = parentPort;
if (!port) throw new Error("cpu-thread.ts must run as a worker thread");

/** Large binary results go back as transfers, not copies. */
function transfers(value: unknown): ArrayBuffer[] {
  const out: ArrayBuffer[] = [];
  const visit = (v: unknown, depth: number) => {
    if (depth > 2 || v === null || typeof v !== "object") return;
    if (ArrayBuffer.isView(v)) {
      const b = v.buffer;
      if (
        b instanceof ArrayBuffer &&
        v.byteOffset === 0 &&
        v.byteLength === b.byteLength &&
        b.byteLength > 65_536
      )
        if (!out.includes(b)) out.push(b);
      return;
    }
    for (const x of Object.values(v)) visit(x, depth + 1);
  };
  visit(value, 0);
  return out;
}

port.on("message", async (msg: { id: number; task: keyof typeof cpuTasks; arg: unknown }) => {
  try {
    const fn = cpuTasks[msg.task] as (arg: unknown) => unknown;
    const value = await fn(msg.arg);
    port.postMessage({ id: msg.id, ok: true, value }, transfers(value));
  } catch (e) {
    const err = e instanceof Error ? e : new Error(String(e));
    const fields: Record<string, unknown> = {};
    // Plain values and arrays of them (a MaterializeError's content path) cross the thread boundary.
    for (const [k, v] of Object.entries(err))
      if (
        (typeof v !== "function" && typeof v !== "object") ||
        (Array.isArray(v) && v.every((x) => typeof x === "string" || typeof x === "number"))
      )
        fields[k] = v;
    port.postMessage({ id: msg.id, ok: false, error: { name: err.name, message: err.message, fields } });
  }
});
