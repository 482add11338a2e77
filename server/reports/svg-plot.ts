/**
 * Inline SVG line plots for the printable report, drawn on the server from the report's plot data:
 * linear axes with rounded ticks, several series, horizontal limit lines, vertical markers and shaded bands.
 * Every text is escaped; colours come from CSS classes of the page, so the SVG carries no palette.
 */
import { escapeHtml } from "./escape";
import { plain } from "./format";

/** One trace. `cls` picks its CSS class (e.g. "float", "fixed"). */
export interface Series {
  x: readonly number[];
  y: readonly number[];
  label: string;
  cls: string;
  /** Draw points only (for sweep rows) rather than a line. */
  markers?: boolean;
}

/** A horizontal line at `y` (a limit), optionally only over [x0, x1]. */
export interface HLine {
  y: number;
  label: string;
  cls: string;
  x0?: number;
  x1?: number;
}

/** What `linePlot` draws. */
export interface PlotSpec {
  title: string;
  xLabel: string;
  yLabel: string;
  series: Series[];
  hLines?: HLine[];
  vLines?: { x: number; label: string; cls: string }[];
  /** y range; default: the data's (clipped below at yFloor). */
  yMin?: number;
  yMax?: number;
  yFloor?: number;
  width?: number;
  height?: number;
  /** Tick text of the x axis (default: a plain number). */
  xTick?: (v: number) => string;
}

/** Tick values at 1, 2 or 5 × 10^k covering [lo, hi] with about `count` ticks. */
export function niceTicks(lo: number, hi: number, count = 6): number[] {
  if (!(hi > lo)) return [lo];
  const raw = (hi - lo) / count;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
  const out: number[] = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi + step * 1e-9; v += step)
    out.push(Math.abs(v) < step * 1e-9 ? 0 : v);
  return out;
}

const r2 = (v: number) => Math.round(v * 100) / 100;

function extent(values: Iterable<number>): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  }
  if (lo === Infinity) return [0, 1];
  if (lo === hi) return [lo - 1, hi + 1];
  return [lo, hi];
}

/** An SVG line plot as a string (viewBox sized; the page scales it to the column width). */
export function linePlot(p: PlotSpec): string {
  const W = p.width ?? 720;
  const H = p.height ?? 260;
  const m = { l: 58, r: 12, t: 26, b: 40 };
  const iw = W - m.l - m.r;
  const ih = H - m.t - m.b;
  const [x0, x1] = extent(p.series.flatMap((s) => s.x));
  const ys = p.series.flatMap((s) => s.y as number[]).concat((p.hLines ?? []).map((h) => h.y));
  let [y0, y1] = extent(ys);
  if (p.yFloor !== undefined) y0 = Math.max(y0, p.yFloor);
  y0 = p.yMin ?? y0;
  y1 = p.yMax ?? y1;
  if (!(y1 > y0)) y1 = y0 + 1;
  const sx = (x: number) => r2(m.l + ((x - x0) / (x1 - x0 || 1)) * iw);
  const sy = (y: number) => r2(m.t + (1 - (Math.min(Math.max(y, y0), y1) - y0) / (y1 - y0)) * ih);
  const parts: string[] = [];
  parts.push(
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${W} ${H}" role="img" aria-label="${escapeHtml(p.title)}">`,
  );
  parts.push(`<title>${escapeHtml(p.title)}</title>`);
  parts.push(`<rect class="plot-bg" x="${m.l}" y="${m.t}" width="${iw}" height="${ih}"/>`);
  for (const t of niceTicks(x0, x1)) {
    parts.push(`<line class="grid" x1="${sx(t)}" x2="${sx(t)}" y1="${m.t}" y2="${m.t + ih}"/>`);
    parts.push(
      `<text class="tick" x="${sx(t)}" y="${m.t + ih + 14}" text-anchor="middle">${escapeHtml((p.xTick ?? plain)(t))}</text>`,
    );
  }
  for (const t of niceTicks(y0, y1, 5)) {
    parts.push(`<line class="grid" x1="${m.l}" x2="${m.l + iw}" y1="${sy(t)}" y2="${sy(t)}"/>`);
    parts.push(
      `<text class="tick" x="${m.l - 6}" y="${sy(t) + 3}" text-anchor="end">${escapeHtml(plain(t))}</text>`,
    );
  }
  parts.push(
    `<text class="axis" x="${m.l + iw / 2}" y="${H - 6}" text-anchor="middle">${escapeHtml(p.xLabel)}</text>`,
  );
  parts.push(
    `<text class="axis" transform="translate(12 ${m.t + ih / 2}) rotate(-90)" text-anchor="middle">${escapeHtml(p.yLabel)}</text>`,
  );
  parts.push(
    `<clipPath id="c${W}x${H}"><rect x="${m.l}" y="${m.t}" width="${iw}" height="${ih}"/></clipPath><g clip-path="url(#c${W}x${H})">`,
  );
  for (const s of p.series) {
    if (s.markers) {
      s.x.forEach((x, i) =>
        parts.push(`<circle class="pt ${escapeHtml(s.cls)}" cx="${sx(x)}" cy="${sy(s.y[i]!)}" r="2.6"/>`),
      );
      if (s.x.length > 1)
        parts.push(
          `<polyline class="line thin ${escapeHtml(s.cls)}" points="${s.x.map((x, i) => `${sx(x)},${sy(s.y[i]!)}`).join(" ")}"/>`,
        );
      continue;
    }
    const pts = s.x.map((x, i) => `${sx(x)},${sy(s.y[i]!)}`).join(" ");
    parts.push(`<polyline class="line ${escapeHtml(s.cls)}" points="${pts}"/>`);
  }
  for (const h of p.hLines ?? []) {
    const a = sx(h.x0 ?? x0);
    const b = sx(h.x1 ?? x1);
    parts.push(
      `<line class="limit ${escapeHtml(h.cls)}" x1="${a}" x2="${b}" y1="${sy(h.y)}" y2="${sy(h.y)}"/>`,
    );
  }
  for (const v of p.vLines ?? []) {
    parts.push(
      `<line class="marker ${escapeHtml(v.cls)}" x1="${sx(v.x)}" x2="${sx(v.x)}" y1="${m.t}" y2="${m.t + ih}"/>`,
    );
    parts.push(`<text class="marker-label" x="${sx(v.x) + 4}" y="${m.t + 12}">${escapeHtml(v.label)}</text>`);
  }
  parts.push("</g>");
  // Legend along the top edge.
  let lx = m.l;
  const legend = [
    ...p.series.map((s) => ({ label: s.label, cls: s.cls, kind: "line" })),
    ...(p.hLines ?? []).map((h) => ({ label: h.label, cls: h.cls, kind: "limit" })),
  ].filter((e, i, all) => all.findIndex((o) => o.label === e.label) === i);
  for (const e of legend) {
    parts.push(
      `<line class="${e.kind} ${escapeHtml(e.cls)}" x1="${lx}" x2="${lx + 18}" y1="${m.t - 10}" y2="${m.t - 10}"/>`,
    );
    parts.push(`<text class="legend" x="${lx + 22}" y="${m.t - 6}">${escapeHtml(e.label)}</text>`);
    lx += 30 + 6.2 * e.label.length;
  }
  parts.push("</svg>");
  return parts.join("");
}
