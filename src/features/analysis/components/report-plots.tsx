import { useMemo } from "react";
import type { AnalysisReport } from "@shared/dsp/analysis";
import { SignalPlot } from "@/components/plot";
import { sweepPlots, tracePlots } from "../lib/report-plots";

/** The plots grid: the report's traces, then the bit-width sweep. */
export function ReportPlots({ report }: { report: AnalysisReport }) {
  const traces = useMemo(() => tracePlots(report), [report]);
  const sweep = useMemo(() => sweepPlots(report), [report]);
  return (
    <div className="grid grid-cols-1 gap-3 xl:grid-cols-2">
      {[...traces, ...sweep].map(({ key, ...p }) => (
        <SignalPlot key={key} {...p} height={220} />
      ))}
    </div>
  );
}
