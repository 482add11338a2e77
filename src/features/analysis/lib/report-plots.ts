/**
 * The report's plot data (shared/dsp/analysis.ts `plots`, `sweep`) turned into SignalPlot props. Pure: the
 * plots grid renders what this returns, and tests check that no figure is altered on the way.
 */
import type { AnalysisReport } from "@shared/dsp/analysis";
import type { AcceptanceLimits } from "@shared/dsp/types";
import type { PlotMarker, PlotTrace, SignalPlotProps } from "@/components/plot";
import { LIMIT_VIEW } from "./metric-rows";

/** Props for one plot of the grid. */
export type ReportPlot = Omit<SignalPlotProps, "height"> & { key: string };

const f64 = (xs: ArrayLike<number | null>) => Float64Array.from(xs, (v) => (v === null ? Number.NaN : v));

/** Known traces: title, x axis and what each array is. Unknown traces fall back to their field names. */
const KNOWN: Record<
  string,
  { title: string; x: { label: string; unit: string }; y: { label: string; unit: string } }
> = {
  compressed: {
    title: "Compressed output, full range",
    x: { label: "Delay from target", unit: "samples" },
    y: { label: "Level re float peak", unit: "dB" },
  },
  mainlobe: {
    title: "Compressed output, mainlobe close-up",
    x: { label: "Delay from target", unit: "samples" },
    y: { label: "Level re float peak", unit: "dB" },
  },
  spectrum: {
    title: "Transmit spectrum",
    x: { label: "Frequency", unit: "MHz" },
    y: { label: "Level re float peak", unit: "dB" },
  },
  doppler: {
    title: "Doppler cut",
    x: { label: "Delay from target", unit: "samples" },
    y: { label: "Level re zero-Doppler float peak", unit: "dB" },
  },
  response: {
    title: "FIR magnitude response",
    x: { label: "Frequency", unit: "MHz" },
    y: { label: "Magnitude re passband", unit: "dB" },
  },
};

/** Series names people read in a legend; float is the signal tone, fixed the copper one (UI.md). */
const SERIES: Record<string, { label: string; tone: PlotTrace["tone"] }> = {
  floatDb: { label: "Float", tone: "signal" },
  fixedDb: { label: "Fixed", tone: "copper" },
  re: { label: "I", tone: "copper" },
  im: { label: "Q", tone: "ink" },
};

const isNumbers = (v: unknown): v is (number | null)[] =>
  Array.isArray(v) && v.every((x) => x === null || typeof x === "number");

/** Horizontal lines for limits on a plot (a constant series, so its read-out shows the limit value). */
function limitSeries(
  names: (keyof AcceptanceLimits)[],
  limits: AnalysisReport["limits"],
  n: number,
  unit: string,
): PlotTrace[] {
  const out: PlotTrace[] = [];
  for (const name of names) {
    const c = limits.find((l) => l.name === name);
    if (!c) continue;
    out.push({
      label: `${LIMIT_VIEW[name].label} limit`,
      unit,
      tone: "warn",
      values: new Float64Array(n).fill(c.limit),
    });
  }
  return out;
}

/**
 * Stopband masks: one series per stopband at −(attenuation limit) dB, NaN outside its band. One band per
 * series, so the canvas never joins two bands across the passband.
 */
export function stopbandMasks(
  x: Float64Array,
  stopbands: readonly (readonly [number, number])[],
  limitDb: number,
): PlotTrace[] {
  return stopbands.map(([lo, hi], i) => ({
    label: stopbands.length > 1 ? `Stopband mask ${i + 1}` : "Stopband mask",
    unit: "dB",
    tone: "warn" as const,
    values: x.map((f) => (Math.abs(f) >= lo && Math.abs(f) <= hi ? -limitDb : Number.NaN)),
  }));
}

// Frequencies arrive in Hz; the axis reads better in MHz (values scaled, masks compared in Hz).
const X_SCALE: Record<string, number> = { spectrum: 1e-6, response: 1e-6 };

function seriesOf(trace: Record<string, unknown>, n: number, unit: string): PlotTrace[] {
  const series: PlotTrace[] = [];
  // Legend order: float, fixed (or I, Q), then anything else the server adds.
  const known = Object.keys(SERIES);
  const fields = Object.keys(trace).sort(
    (a, b) => (known.indexOf(a) + 1 || 99) - (known.indexOf(b) + 1 || 99),
  );
  for (const field of fields) {
    const v = trace[field];
    if (field === "x" || !isNumbers(v) || v.length !== n) continue;
    const s = SERIES[field] ?? { label: field, tone: "ink" as const };
    series.push({ label: s.label, unit, tone: s.tone, values: f64(v) });
  }
  return series;
}

/** The report's traces in a stable order (known ones, then any others), then the coefficient errors in LSB. */
export function tracePlots(
  report: Pick<AnalysisReport, "plots" | "limits" | "kind" | "coefficientErrorLsb" | "firBands">,
): ReportPlot[] {
  const keys = Object.keys(report.plots);
  const order = [
    ...Object.keys(KNOWN).filter((k) => keys.includes(k)),
    ...keys.filter((k) => !(k in KNOWN)).sort(),
  ];
  const plots: ReportPlot[] = [];
  for (const key of order) {
    const trace = report.plots[key] as unknown as Record<string, unknown>;
    if (!trace || !isNumbers(trace.x)) continue;
    const known = KNOWN[key];
    const x = f64(trace.x);
    const series = seriesOf(trace, x.length, known?.y.unit ?? "");
    if (series.length === 0) continue;
    if (key === "compressed" || key === "mainlobe")
      series.push(...limitSeries(["pslDbMax"], report.limits, x.length, "dB"));
    const att = report.limits.find((c) => c.name === "stopbandAttenuationDbMin");
    if (key === "response" && att && report.firBands)
      series.push(...stopbandMasks(x, report.firBands.stopbands, att.limit));
    const scale = X_SCALE[key] ?? 1;
    const xs = scale === 1 ? x : x.map((v) => v * scale);
    plots.push({
      key,
      title: known?.title ?? key,
      fileName: `report-${key}`,
      x: { ...(known?.x ?? { label: "x", unit: "" }), values: xs },
      series,
      yAxis: known?.y ?? { label: key, unit: "" },
    });
  }
  for (const [role, trace] of Object.entries(report.coefficientErrorLsb ?? {})) {
    const x = f64(trace.x);
    plots.push({
      key: `lsb-${role}`,
      title: `Coefficient error, table ${role}`,
      fileName: `report-coefficient-error-${role}`,
      x: { label: "Coefficient index", unit: "", values: x },
      // A real table's Q error is identically zero: leave it out rather than draw a flat line.
      series: (() => {
        const all = seriesOf(trace as unknown as Record<string, unknown>, x.length, "LSB");
        const real = !all.some((t) => t.label === "Q" && t.values.some((v) => v !== 0));
        // A real table has one error per tap: "Error", not "I" of an I/Q pair.
        return real
          ? all.filter((t) => t.label !== "Q").map((t) => (t.label === "I" ? { ...t, label: "Error" } : t))
          : all;
      })(),
      yAxis: { label: "ĥ − g·h", unit: "LSB" },
    });
  }
  return plots;
}

/** Which sweep figures are plotted together, with the limits drawn on each. */
const SWEEP_GROUPS: Record<
  AnalysisReport["kind"],
  { key: string; title: string; figures: [string, string][]; limits: (keyof AcceptanceLimits)[] }[]
> = {
  waveform: [
    {
      key: "sweep-sidelobes",
      title: "Bit-width sweep: sidelobes",
      figures: [
        ["pslDb", "PSL"],
        ["islrDb", "ISLR"],
      ],
      limits: ["pslDbMax", "islrDbMax"],
    },
    {
      key: "sweep-losses",
      title: "Bit-width sweep: losses",
      figures: [
        ["mismatchLossDb", "Mismatch loss"],
        ["peakLossDb", "Peak loss"],
      ],
      limits: ["mismatchLossDbMax", "peakLossDbMax"],
    },
    {
      key: "sweep-sqnr",
      title: "Bit-width sweep: coefficient SQNR",
      figures: [["coefficientSqnrDb", "SQNR"]],
      limits: ["coefficientSqnrDbMin"],
    },
  ],
  filter: [
    {
      key: "sweep-stopband",
      title: "Bit-width sweep: stopband attenuation",
      figures: [["stopbandAttenuationDb", "Stopband attenuation"]],
      limits: ["stopbandAttenuationDbMin"],
    },
    {
      key: "sweep-ripple",
      title: "Bit-width sweep: passband ripple",
      figures: [["passbandRippleDb", "Passband ripple"]],
      limits: ["passbandRippleDbMax"],
    },
    {
      key: "sweep-sqnr",
      title: "Bit-width sweep: coefficient SQNR",
      figures: [["coefficientSqnrDb", "SQNR"]],
      limits: ["coefficientSqnrDbMin"],
    },
  ],
};

// Ink and copper, so the amber limit lines stand apart from the figures.
const TONES: PlotTrace["tone"][] = ["ink", "copper"];

/** The sweep as plots: figure vs W, the limits as lines, the smallest passing W marked. */
export function sweepPlots(report: Pick<AnalysisReport, "sweep" | "limits" | "kind">): ReportPlot[] {
  const sweep = report.sweep;
  if (!sweep || sweep.rows.length === 0) return [];
  const x = Float64Array.from(sweep.rows, (r) => r.wordLength);
  // No limits: every W passes vacuously, so no W is marked as the recommendation.
  const markers: PlotMarker[] =
    sweep.smallestPassingWordLength === null || report.limits.length === 0
      ? []
      : [{ x: sweep.smallestPassingWordLength, label: `W = ${sweep.smallestPassingWordLength}` }];
  const plots: ReportPlot[] = [];
  for (const g of SWEEP_GROUPS[report.kind]) {
    const series: PlotTrace[] = g.figures
      .filter(([k]) => sweep.rows.some((r) => typeof r.figures[k] === "number"))
      .map(([k, label], i) => ({
        label,
        unit: "dB",
        tone: TONES[i % TONES.length]!,
        values: f64(sweep.rows.map((r) => r.figures[k] ?? null)),
      }));
    if (series.length === 0) continue;
    series.push(...limitSeries(g.limits, report.limits, x.length, "dB"));
    plots.push({
      key: g.key,
      title: g.title,
      fileName: `report-${g.key}`,
      x: { label: "Word length W", unit: "bits", values: x },
      series,
      yAxis: { label: "Figure", unit: "dB" },
      markers,
    });
  }
  return plots;
}
