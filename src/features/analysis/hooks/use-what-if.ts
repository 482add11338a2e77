import { useQueries } from "@tanstack/react-query";
import { useEffect, useRef, useState } from "react";
import type { CoefficientTable, RevisionContent } from "@shared/schemas/designs";
import { tableValuesQueryOptions } from "@/features/revisions/api/get-table-values";
import type { WhatIfResult } from "../lib/what-if-run";
import type { WhatIfRequest, WhatIfResponse } from "../workers/what-if.worker";

/** Input settles for this long before a run starts (typing "16" should not run W = 1 first). */
export const DEBOUNCE_MS = 250;

/** What the panel shows: the last answer for the newest request, or why there is none. */
export interface WhatIfState {
  status: "loading-tables" | "idle" | "running" | "done" | "error";
  result: WhatIfResult | null;
  error: string | null;
}

function startWorker(): Worker {
  return new Worker(new URL("../workers/what-if.worker.ts", import.meta.url), { type: "module" });
}

/**
 * Runs the DSP core in a Web Worker on `content` (null = nothing to run) with the revision's stored tables.
 * Debounced; a newer request terminates a busy worker, so a stale run never delays the fresh one, and
 * answers are matched by request id.
 */
export function useWhatIf(
  revisionId: number,
  tables: CoefficientTable[],
  content: RevisionContent | null,
): WhatIfState {
  const values = useQueries({ queries: tables.map((t) => tableValuesQueryOptions(revisionId, t.id)) });
  const ready = values.every((q) => q.isSuccess);
  const loadError = values.find((q) => q.error)?.error;
  const [state, setState] = useState<WhatIfState>({ status: "loading-tables", result: null, error: null });
  const worker = useRef<Worker | null>(null);
  const busy = useRef(false);
  const latest = useRef(0);

  useEffect(
    () => () => {
      worker.current?.terminate();
      worker.current = null;
    },
    [],
  );

  // The values arrays are stable per table id (staleTime: Infinity), so this key changes only with content.
  const contentKey = content ? JSON.stringify(content) : "";
  useEffect(() => {
    if (!content || !ready) return;
    const id = ++latest.current;
    const timer = window.setTimeout(() => {
      if (busy.current && worker.current) {
        worker.current.terminate();
        worker.current = null;
      }
      const w = worker.current ?? (worker.current = startWorker());
      w.onmessage = (e: MessageEvent<WhatIfResponse>) => {
        busy.current = false;
        if (e.data.id !== latest.current) return;
        setState(
          e.data.ok
            ? { status: "done", result: e.data.result, error: null }
            : { status: "error", result: null, error: e.data.error },
        );
      };
      w.onerror = (e) => {
        busy.current = false;
        e.preventDefault();
        if (id === latest.current)
          setState({ status: "error", result: null, error: e.message || "The what-if worker stopped" });
      };
      const request: WhatIfRequest = {
        id,
        content,
        tables: tables.map((t, i) => {
          const v = values[i]!.data!;
          return { ...t, re: v.re, im: v.im };
        }),
      };
      busy.current = true;
      setState((s) => ({ ...s, status: "running" }));
      w.postMessage(request);
    }, DEBOUNCE_MS);
    return () => window.clearTimeout(timer);
    // `values` and `tables` follow from the revision, which `contentKey` and `ready` already track.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [contentKey, ready]);

  if (loadError) return { status: "error", result: null, error: loadError.message };
  if (!ready) return { status: "loading-tables", result: null, error: null };
  return state;
}
