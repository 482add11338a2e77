/**
 * Web Worker for the what-if panel: one request at a time, each tagged with an id so the page can drop
 * answers to stale requests (it also terminates a busy worker when a newer request arrives).
 */
import type { RevisionContent } from "@shared/schemas/designs";
import { runWhatIf, type WhatIfResult, type WhatIfTables } from "../lib/what-if-run";

/** Page → worker. */
export interface WhatIfRequest {
  id: number;
  content: RevisionContent;
  tables: WhatIfTables;
}

/** Worker → page. */
export type WhatIfResponse =
  { id: number; ok: true; result: WhatIfResult } | { id: number; ok: false; error: string };

// The project compiles against the DOM lib; name only what a dedicated worker's scope offers here.
const scope = self as unknown as {
  onmessage: ((e: MessageEvent<WhatIfRequest>) => void) | null;
  postMessage: (message: WhatIfResponse) => void;
};

scope.onmessage = (e: MessageEvent<WhatIfRequest>) => {
  const { id, content, tables } = e.data;
  let answer: WhatIfResponse;
  try {
    answer = { id, ok: true, result: runWhatIf(content, tables) };
  } catch (err) {
    // A ZodError or RangeError from the DSP core names the field; pass its words on.
    answer = { id, ok: false, error: err instanceof Error ? err.message : String(err) };
  }
  scope.postMessage(answer);
};
