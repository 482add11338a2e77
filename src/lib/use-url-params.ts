import { useCallback, useEffect, useRef } from "react";
import { useSearchParams } from "react-router-dom";

/**
 * The page's search params plus a writer that builds on the LATEST written params. React Router's
 * functional `setSearchParams` reads the params of the render that made the handler, so two quick
 * changes (two selects in a row) would otherwise undo each other.
 */
export function useUrlParams() {
  const [params, setParams] = useSearchParams();
  const latest = useRef(params);
  useEffect(() => {
    latest.current = params;
  }, [params]);
  const write = useCallback(
    (
      make: (current: URLSearchParams) => URLSearchParams,
      opts: { replace?: boolean } = { replace: true },
    ) => {
      const next = make(latest.current);
      latest.current = next;
      setParams(next, opts);
    },
    [setParams],
  );
  return [params, write] as const;
}
