import { lazy, Suspense } from "react";
import { Skeleton } from "@/components/ui/states";
import type { SignalPlotProps } from "./types";

export type { PlotMarker, PlotTrace, SignalPlotProps, TraceTone, XYData } from "./types";

// uPlot and its CSS load only when a page first draws a plot.
const SignalPlotImpl = lazy(() => import("./signal-plot"));

/** A zoomable line plot (uPlot), loaded on first use; shows a placeholder of its height meanwhile. */
export function SignalPlot(props: SignalPlotProps) {
  return (
    <Suspense
      fallback={
        <div
          role="status"
          aria-label={`Loading ${props.title}`}
          style={{ height: (props.height ?? 220) + 64 }}
        >
          <Skeleton className="h-full w-full" />
        </div>
      }
    >
      <SignalPlotImpl {...props} />
    </Suspense>
  );
}
