import "uplot/dist/uPlot.min.css";
import "./plot.css";
import { useEffect, useMemo, useRef, useState } from "react";
import uPlot from "uplot";
import { Button } from "@/components/ui/button";
import palette from "../../../tailwind.config";
import { plotCsv } from "./plot-csv";
import type { SignalPlotProps, TraceTone, XYData } from "./types";

const colors = palette.theme.extend.colors;
// Canvas needs concrete colours: take them from the palette tokens rather than writing hex here.
const TONES: Record<TraceTone, string> = {
  signal: colors.signal[600],
  copper: colors.copper[500],
  ink: colors.ink[500],
  warn: colors.warn[600],
};
/** The dB range a level plot shows below its highest value (common practice for a display of sidelobes). */
const DB_SPAN = 100;
const AXIS = { stroke: colors.ink[700], grid: colors.paper[300], tick: colors.paper[400] };
const FONT = '11px "JetBrains Mono", ui-monospace, monospace';

/** Six significant figures: enough to read a cursor position without drowning the legend. */
function readout(v: number | null | undefined, unit: string): string {
  if (v == null || !Number.isFinite(v)) return "—";
  const s = Math.abs(v) >= 1e-3 || v === 0 ? Number(v.toPrecision(6)).toString() : v.toExponential(4);
  return unit ? `${s} ${unit}` : s;
}

function download(href: string, fileName: string) {
  const a = document.createElement("a");
  a.href = href;
  a.download = fileName;
  document.body.append(a);
  a.click();
  a.remove();
}

/** NaN marks "no value here" (e.g. a mask outside its band); uPlot draws a gap only for null. */
function gaps(y: Float64Array): Float64Array | (number | null)[] {
  return y.some(Number.isNaN) ? Array.from(y, (v) => (Number.isNaN(v) ? null : v)) : y;
}

/** Dashed vertical lines with labels, drawn over the series (canvas pixels include the device ratio). */
function drawMarkers(u: uPlot, markers: SignalPlotProps["markers"]) {
  if (!markers?.length) return;
  const { ctx, bbox } = u;
  ctx.save();
  ctx.strokeStyle = TONES.warn;
  ctx.fillStyle = TONES.warn;
  ctx.lineWidth = uPlot.pxRatio;
  ctx.setLineDash([4 * uPlot.pxRatio, 3 * uPlot.pxRatio]);
  ctx.font = `${11 * uPlot.pxRatio}px "JetBrains Mono", ui-monospace, monospace`;
  for (const m of markers) {
    const px = u.valToPos(m.x, "x", true);
    if (px < bbox.left || px > bbox.left + bbox.width) continue;
    ctx.beginPath();
    ctx.moveTo(px, bbox.top);
    ctx.lineTo(px, bbox.top + bbox.height);
    ctx.stroke();
    ctx.fillText(m.label, px + 4 * uPlot.pxRatio, bbox.top + 12 * uPlot.pxRatio);
  }
  ctx.restore();
}

/**
 * One uPlot chart: drag to zoom (x), Shift+drag or the arrow keys to pan, wheel to zoom around the cursor,
 * Reset, cursor read-out in the legend, PNG and CSV export. With `reduce` it draws what that returns for the
 * range in view (e.g. a min/max envelope), recomputed at each zoom.
 */
export default function SignalPlot({
  title,
  x,
  series,
  yAxis,
  fileName,
  height = 220,
  reduce,
  reduceNote,
  markers,
}: SignalPlotProps) {
  const holder = useRef<HTMLDivElement>(null);
  const plotRef = useRef<uPlot | null>(null);
  const [zoomed, setZoomed] = useState(false);
  const full: XYData = useMemo(() => ({ x: x.values, ys: series.map((s) => s.values) }), [x.values, series]);
  const xMin = full.x[0] ?? 0;
  const xMax = full.x[full.x.length - 1] ?? 1;

  useEffect(() => {
    const el = holder.current;
    if (!el) return;
    const width = Math.max(320, el.clientWidth);
    const view = (lo: number, hi: number, cols: number): uPlot.AlignedData => {
      const d = reduce ? reduce(lo, hi, cols) : full;
      // uPlot accepts typed arrays (STACK.md); its types only name plain arrays.
      return [d.x, ...d.ys.map(gaps)] as unknown as uPlot.AlignedData;
    };
    let panFrom: { px: number; min: number; max: number } | null = null;
    const opts: uPlot.Options = {
      width,
      height,
      title: undefined,
      scales: {
        x: { time: false },
        y:
          yAxis.min !== undefined || yAxis.max !== undefined
            ? { auto: false, range: [yAxis.min ?? -1, yAxis.max ?? 1] }
            : yAxis.unit === "dB"
              ? // Numerical floors (−150…−300 dB) would squash what matters: show the top DB_SPAN dB.
                { range: (_u: uPlot, min: number, max: number) => [Math.max(min, max - DB_SPAN), max + 3] }
              : {},
      },
      axes: [
        {
          label: x.unit ? `${x.label} (${x.unit})` : x.label,
          stroke: AXIS.stroke,
          font: FONT,
          labelFont: FONT,
          grid: { stroke: AXIS.grid, width: 1 },
          ticks: { stroke: AXIS.tick, width: 1 },
        },
        {
          label: yAxis.unit ? `${yAxis.label} (${yAxis.unit})` : yAxis.label,
          stroke: AXIS.stroke,
          font: FONT,
          labelFont: FONT,
          size: 64,
          grid: { stroke: AXIS.grid, width: 1 },
          ticks: { stroke: AXIS.tick, width: 1 },
        },
      ],
      series: [
        { label: x.label, value: (_u, v) => readout(v, x.unit) },
        ...series.map((s) => ({
          label: s.label,
          stroke: TONES[s.tone],
          // Fixed (copper) is dashed over a wider float trace, so equal curves still show both; limits dotted.
          width: s.tone === "signal" ? 2 : 1.25,
          ...(s.tone === "copper" ? { dash: [6, 3] } : s.tone === "warn" ? { dash: [2, 3] } : {}),
          points: { show: false },
          value: (_u: uPlot, v: number | null) => readout(v, s.unit),
        })),
      ],
      cursor: {
        drag: { x: true, y: false, setScale: true },
        // Shift+drag pans, so uPlot's own zoom selection must not start on it.
        bind: { mousedown: (_u, _t, handler) => (e: MouseEvent) => (e.shiftKey ? null : handler(e)) },
      },
      legend: { live: true },
      hooks: {
        draw: [(u) => drawMarkers(u, markers)],
        setScale: [
          (u, key) => {
            if (key !== "x") return;
            const min = u.scales.x!.min ?? xMin;
            const max = u.scales.x!.max ?? xMax;
            setZoomed(min > xMin || max < xMax);
            if (reduce)
              u.setData(
                view(min, max, u.bbox.width > 0 ? Math.round(u.bbox.width / uPlot.pxRatio) : width),
                false,
              );
          },
        ],
      },
    };
    const u = new uPlot(opts, view(xMin, xMax, width), el);
    plotRef.current = u;
    const over = u.over;
    const onWheel = (e: WheelEvent) => {
      e.preventDefault();
      const min = u.scales.x!.min!;
      const max = u.scales.x!.max!;
      const at = u.posToVal(e.offsetX, "x");
      const f = e.deltaY < 0 ? 0.8 : 1.25;
      u.setScale("x", { min: Math.max(xMin, at - (at - min) * f), max: Math.min(xMax, at + (max - at) * f) });
    };
    const onDown = (e: MouseEvent) => {
      if (!e.shiftKey) return;
      panFrom = { px: e.clientX, min: u.scales.x!.min!, max: u.scales.x!.max! };
    };
    const onMove = (e: MouseEvent) => {
      if (!panFrom) return;
      const perPx = (panFrom.max - panFrom.min) / over.clientWidth;
      const shift = (panFrom.px - e.clientX) * perPx;
      const span = panFrom.max - panFrom.min;
      const min = Math.min(Math.max(xMin, panFrom.min + shift), xMax - span);
      u.setScale("x", { min, max: min + span });
    };
    const onUp = () => (panFrom = null);
    over.addEventListener("wheel", onWheel, { passive: false });
    over.addEventListener("mousedown", onDown);
    window.addEventListener("mousemove", onMove);
    window.addEventListener("mouseup", onUp);
    const resize = new ResizeObserver(() => {
      const w = Math.max(320, el.clientWidth);
      if (Math.abs(w - u.width) > 1) u.setSize({ width: w, height });
    });
    resize.observe(el);
    return () => {
      resize.disconnect();
      window.removeEventListener("mousemove", onMove);
      window.removeEventListener("mouseup", onUp);
      u.destroy();
      plotRef.current = null;
    };
  }, [
    full,
    reduce,
    markers,
    height,
    series,
    x.label,
    x.unit,
    xMax,
    xMin,
    yAxis.label,
    yAxis.max,
    yAxis.min,
    yAxis.unit,
  ]);

  const pan = (direction: -1 | 1) => {
    const u = plotRef.current;
    if (!u) return;
    const min = u.scales.x!.min!;
    const max = u.scales.x!.max!;
    const span = max - min;
    const lo = Math.min(Math.max(xMin, min + direction * span * 0.25), xMax - span);
    u.setScale("x", { min: lo, max: lo + span });
  };
  const reset = () => plotRef.current?.setScale("x", { min: xMin, max: xMax });
  const exportPng = () => {
    const u = plotRef.current;
    if (!u) return;
    const src = u.ctx.canvas;
    const out = document.createElement("canvas");
    out.width = src.width;
    out.height = src.height;
    const ctx = out.getContext("2d");
    if (!ctx) return;
    // The plot canvas is transparent; give the PNG the page's paper background.
    ctx.fillStyle = colors.paper[50];
    ctx.fillRect(0, 0, out.width, out.height);
    ctx.drawImage(src, 0, 0);
    download(out.toDataURL("image/png"), `${fileName}.png`);
  };
  const exportCsv = () => {
    const csv = plotCsv({ label: x.label, unit: x.unit }, series, full.x, full.ys);
    const url = URL.createObjectURL(new Blob([csv], { type: "text/csv" }));
    download(url, `${fileName}.csv`);
    window.setTimeout(() => URL.revokeObjectURL(url), 1000);
  };

  return (
    <figure className="rounded border border-paper-300 bg-paper-50 p-2">
      <div className="mb-1 flex flex-wrap items-center justify-between gap-2">
        <figcaption className="text-xs font-semibold text-ink-800">
          {title}
          {reduce && reduceNote && <span className="ml-2 font-normal text-ink-600">{reduceNote}</span>}
        </figcaption>
        <div className="flex items-center gap-1" role="toolbar" aria-label={`${title} controls`}>
          <Button size="sm" variant="ghost" onClick={() => pan(-1)} aria-label={`Pan ${title} left`}>
            ◀
          </Button>
          <Button size="sm" variant="ghost" onClick={() => pan(1)} aria-label={`Pan ${title} right`}>
            ▶
          </Button>
          <Button size="sm" variant="ghost" onClick={reset} disabled={!zoomed}>
            Reset zoom
          </Button>
          <Button size="sm" variant="ghost" onClick={exportPng}>
            PNG
          </Button>
          <Button size="sm" variant="ghost" onClick={exportCsv}>
            CSV
          </Button>
        </div>
      </div>
      <div
        ref={holder}
        role="group"
        aria-label={`${title}: ${series.map((s) => s.label).join(", ")} against ${x.label.toLowerCase()}. Drag to zoom, Shift+drag or arrow keys to pan.`}
        tabIndex={0}
        onKeyDown={(e) => {
          if (e.key === "ArrowLeft") pan(-1);
          else if (e.key === "ArrowRight") pan(1);
          else if (e.key === "Escape" || e.key === "0") reset();
          else return;
          e.preventDefault();
        }}
        className="tw-plot w-full focus-visible:outline-2 focus-visible:outline-signal-500"
      />
    </figure>
  );
}
