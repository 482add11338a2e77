/** Props of the lazily loaded SignalPlot, kept apart so callers import no uPlot code for the types. */

/** A palette token a trace is drawn in: signal = float reference, copper = fixed point / second trace. */
export type TraceTone = "signal" | "copper" | "ink" | "warn";

/** Several y series over one shared x axis. */
export interface XYData {
  x: Float64Array;
  ys: Float64Array[];
}

/** One trace: its legend name, unit for the read-out, colour token and values (same length as x). */
export interface PlotTrace {
  label: string;
  unit: string;
  tone: TraceTone;
  values: Float64Array;
}

/** What SignalPlot draws. NaN in a series is a gap (not drawn, not joined across). */
export interface SignalPlotProps {
  /** Caption, accessible name and control labels. */
  title: string;
  x: { label: string; unit: string; values: Float64Array };
  series: PlotTrace[];
  yAxis: { label: string; unit: string; min?: number; max?: number };
  /** Base name of the exported PNG and CSV files. */
  fileName: string;
  height?: number;
  /**
   * For very long series: the points to draw for the x range in view at `columns` pixel columns (e.g. a
   * min/max envelope). Absent: every point is drawn. Export always writes the full data.
   */
  reduce?: (xMin: number, xMax: number, columns: number) => XYData;
  /** Shown beside the caption when `reduce` is in use. */
  reduceNote?: string;
  /** Vertical marker lines with a short label at the top (e.g. the recommended word length). */
  markers?: PlotMarker[];
}

/** A vertical line at `x`, drawn in the warn tone with its label. */
export interface PlotMarker {
  x: number;
  label: string;
}
