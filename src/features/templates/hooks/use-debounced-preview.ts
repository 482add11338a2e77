import { useEffect, useState } from "react";
import type { PreviewResult } from "@shared/exports/schemas";
import type { SampleKind } from "@shared/exports/sample-kinds";
import { previewTemplate } from "../api/templates";

/** What the preview pane shows. */
export type PreviewState =
  | { status: "idle" }
  | { status: "loading"; last: PreviewResult | null }
  | { status: "done"; result: PreviewResult }
  | { status: "failed"; message: string };

/**
 * Renders `body` on the server after typing pauses for `delayMs`; a newer body aborts the older
 * request, so an old answer never overwrites a newer one.
 */
export function useDebouncedPreview(
  body: string,
  sample: SampleKind,
  enabled: boolean,
  delayMs = 400,
): PreviewState {
  const [state, setState] = useState<PreviewState>({ status: "idle" });
  useEffect(() => {
    if (!enabled || body === "") return;
    const controller = new AbortController();
    const timer = window.setTimeout(() => {
      setState((s) => ({
        status: "loading",
        last: s.status === "done" ? s.result : s.status === "loading" ? s.last : null,
      }));
      previewTemplate({ body, sample }, controller.signal).then(
        (result) => setState({ status: "done", result }),
        (err: unknown) => {
          if (controller.signal.aborted) return;
          setState({ status: "failed", message: err instanceof Error ? err.message : String(err) });
        },
      );
    }, delayMs);
    return () => {
      window.clearTimeout(timer);
      controller.abort();
    };
  }, [body, sample, enabled, delayMs]);
  return state;
}
