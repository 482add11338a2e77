import { useMemo } from "react";
import type { CoefficientTable } from "@shared/schemas/designs";
import { SignalPlot, type PlotTrace, type XYData } from "@/components/plot";
import { ErrorState, Skeleton } from "@/components/ui/states";
import { formatCount } from "@/lib/format";
import { useTableValues } from "../api/get-table-values";
import {
  ENVELOPE_THRESHOLD,
  firResponseDb,
  instantaneousFrequencyMHz,
  magnitude,
  minMaxEnvelope,
  spectrumDb,
  timeAxisUs,
  visibleRange,
  type Samples,
} from "../lib/signal-views";

/** The min/max envelope of the x range in view, for series too long to draw point by point. */
function envelopeOf(data: XYData) {
  if (data.x.length <= ENVELOPE_THRESHOLD) return {};
  return {
    reduce: (lo: number, hi: number, columns: number) =>
      minMaxEnvelope(data, columns, ...visibleRange(data.x, lo, hi)),
    reduceNote: `min/max envelope of ${formatCount(data.x.length)} points`,
  };
}

/** The lowest dB worth showing: the trace's minimum, but no deeper than -160 dB, on a 10 dB step. */
function dbFloor(db: Float64Array): number {
  let min = 0;
  for (const v of db) if (v < min) min = v;
  return Math.floor(Math.max(-160, min) / 10) * 10;
}

function Plots({
  table,
  samples,
  fm,
  fileBase,
}: {
  table: CoefficientTable;
  samples: Samples;
  fm: boolean;
  fileBase: string;
}) {
  const fs = table.sampleRateHz;
  const time = useMemo(() => {
    const x = timeAxisUs(samples.re.length, fs);
    const traces: PlotTrace[] = table.complex
      ? [
          { label: "I", unit: "", tone: "signal", values: samples.re },
          { label: "Q", unit: "", tone: "copper", values: samples.im },
          { label: "|h|", unit: "", tone: "ink", values: magnitude(samples) },
        ]
      : [
          { label: "Value", unit: "", tone: "signal", values: samples.re },
          { label: "|h|", unit: "", tone: "ink", values: magnitude(samples) },
        ];
    return { x, traces, ...envelopeOf({ x, ys: traces.map((t) => t.values) }) };
  }, [samples, fs, table.complex]);
  const freq = useMemo(() => {
    const trace = table.role === "fir" ? firResponseDb(samples, fs, table.complex) : spectrumDb(samples, fs);
    const traces: PlotTrace[] = [
      { label: table.role === "fir" ? "|H|" : "Spectrum", unit: "dB", tone: "signal", values: trace.db },
    ];
    return {
      x: trace.freqMHz,
      traces,
      floor: dbFloor(trace.db),
      ...envelopeOf({ x: trace.freqMHz, ys: [trace.db] }),
    };
  }, [samples, fs, table.role, table.complex]);
  const inst = useMemo(() => {
    if (!fm) return null;
    const { timeUs, values } = instantaneousFrequencyMHz(samples, fs);
    const traces: PlotTrace[] = [{ label: "Frequency", unit: "MHz", tone: "copper", values }];
    return { x: timeUs, traces, ...envelopeOf({ x: timeUs, ys: [values] }) };
  }, [samples, fs, fm]);

  return (
    <div className="grid gap-3 lg:grid-cols-2">
      <SignalPlot
        title={`${table.role}: ${table.complex ? "I, Q and magnitude" : "value and magnitude"} over time`}
        x={{ label: "Time", unit: "µs", values: time.x }}
        series={time.traces}
        yAxis={{ label: "Amplitude", unit: "" }}
        fileName={`${fileBase}-time`}
        reduce={time.reduce}
        reduceNote={time.reduceNote}
      />
      <SignalPlot
        title={
          table.role === "fir"
            ? `${table.role}: magnitude response`
            : `${table.role}: spectrum (0 dB at peak)`
        }
        x={{ label: "Frequency", unit: "MHz", values: freq.x }}
        series={freq.traces}
        yAxis={{
          label: table.role === "fir" ? "Gain" : "Level",
          unit: "dB",
          min: freq.floor,
          max: table.role === "fir" ? undefined : 3,
        }}
        fileName={`${fileBase}-${table.role === "fir" ? "response" : "spectrum"}`}
        reduce={freq.reduce}
        reduceNote={freq.reduceNote}
      />
      {inst && (
        <SignalPlot
          title={`${table.role}: instantaneous frequency`}
          x={{ label: "Time", unit: "µs", values: inst.x }}
          series={inst.traces}
          yAxis={{ label: "Frequency", unit: "MHz" }}
          fileName={`${fileBase}-inst-freq`}
          reduce={inst.reduce}
          reduceNote={inst.reduceNote}
        />
      )}
    </div>
  );
}

/** Fetches one table's values and draws its plots (time, spectrum or response, and FM frequency). */
export function TablePlots({
  revisionId,
  table,
  fm,
  fileBase,
}: {
  revisionId: number;
  table: CoefficientTable;
  fm: boolean;
  fileBase: string;
}) {
  const values = useTableValues(revisionId, table.id);
  if (values.isPending)
    return (
      <div role="status" aria-label={`Loading ${table.role} values`} className="grid gap-3 lg:grid-cols-2">
        <Skeleton className="h-64 w-full" />
        <Skeleton className="h-64 w-full" />
      </div>
    );
  if (values.isError)
    return (
      <ErrorState
        title={`The ${table.role} values could not be loaded`}
        error={values.error}
        onRetry={() => void values.refetch()}
      />
    );
  return <Plots table={table} samples={values.data} fm={fm} fileBase={fileBase} />;
}
