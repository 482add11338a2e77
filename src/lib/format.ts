/** Display helpers for engineering values: dB, SI prefixes, dates. Pure, no locale surprises. */

// ASCII hyphen-minus rather than U+2212, so a value copied from the page pastes into scripts as a number.
const SI_PREFIXES: ReadonlyArray<readonly [number, string]> = [
  [1e12, "T"],
  [1e9, "G"],
  [1e6, "M"],
  [1e3, "k"],
  [1, ""],
  [1e-3, "m"],
  [1e-6, "µ"],
  [1e-9, "n"],
  [1e-12, "p"],
];

/** A level in dB with two decimals, e.g. `-13.26 dB`; non-finite values show as `-inf dB` / `—`. */
export function formatDb(db: number, decimals = 2): string {
  if (Number.isNaN(db)) return "—";
  if (db === -Infinity) return "-inf dB";
  if (db === Infinity) return "+inf dB";
  const s = db.toFixed(decimals);
  // toFixed(-0.001) gives "-0.00": a negative zero reads as a sign error to an engineer.
  return `${/^-0\.?0*$/.test(s) ? s.slice(1) : s} dB`;
}

/** 20·log10 of an amplitude ratio. */
export function amplitudeToDb(ratio: number): number {
  return 20 * Math.log10(ratio);
}

/** 10·log10 of a power ratio. */
export function powerToDb(ratio: number): number {
  return 10 * Math.log10(ratio);
}

/**
 * A value with an SI prefix and three significant figures: `formatEng(1e7, "Hz")` → `10.0 MHz`,
 * `formatEng(5e-5, "s")` → `50.0 µs`. The mantissa stays in [1, 1000).
 */
export function formatEng(value: number, unit: string, significant = 3): string {
  if (!Number.isFinite(value)) return "—";
  if (value === 0) return `0 ${unit}`.trim();
  const abs = Math.abs(value);
  let [scale, prefix] = SI_PREFIXES[SI_PREFIXES.length - 1]!;
  for (const [s, p] of SI_PREFIXES) {
    if (abs >= s * (1 - 5e-13)) {
      [scale, prefix] = [s, p];
      break;
    }
  }
  let mantissa = Number((value / scale).toPrecision(significant));
  // Rounding may carry 999.7 up to 1000: move to the next prefix instead of printing "1000 k".
  if (Math.abs(mantissa) >= 1000) {
    const idx = SI_PREFIXES.findIndex(([s]) => s === scale);
    const up = SI_PREFIXES[idx - 1];
    if (up) {
      [scale, prefix] = up;
      mantissa = Number((value / scale).toPrecision(significant));
    }
  }
  const digits = Math.max(0, significant - 1 - Math.floor(Math.log10(Math.abs(mantissa))));
  return `${mantissa.toFixed(digits)} ${prefix}${unit}`.trim();
}

/** Whole count with thin grouping, e.g. 12 345. */
export function formatCount(n: number): string {
  return Math.round(n)
    .toString()
    .replace(/\B(?=(\d{3})+(?!\d))/g, "\u2009");
}

/** A duration in seconds as `3 d 4 h`, `2 h 05 min`, `7 min 12 s` or `42 s`. */
export function formatDuration(seconds: number): string {
  const s = Math.max(0, Math.floor(seconds));
  const d = Math.floor(s / 86400);
  const h = Math.floor((s % 86400) / 3600);
  const m = Math.floor((s % 3600) / 60);
  const r = s % 60;
  if (d > 0) return `${d} d ${h} h`;
  if (h > 0) return `${h} h ${String(m).padStart(2, "0")} min`;
  if (m > 0) return `${m} min ${String(r).padStart(2, "0")} s`;
  return `${r} s`;
}

/** An ISO timestamp as `2025-03-14 09:26` in the viewer's zone: sortable and unambiguous. */
export function formatDateTime(iso: string | null | undefined): string {
  if (!iso) return "—";
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return "—";
  const p = (n: number) => String(n).padStart(2, "0");
  return `${d.getFullYear()}-${p(d.getMonth() + 1)}-${p(d.getDate())} ${p(d.getHours())}:${p(d.getMinutes())}`;
}

/** A date only, `2025-03-14`. */
export function formatDate(iso: string | null | undefined): string {
  return formatDateTime(iso).slice(0, 10);
}

/** How long a job took: "0.35 s" under 10 s (a tenth would read as "0.0 s"), "42 s", then minutes. */
export function formatElapsed(ms: number): string {
  if (!Number.isFinite(ms) || ms < 0) return "—";
  if (ms < 10) return `${Math.max(1, Math.round(ms))} ms`;
  if (ms < 1000) return `${Math.round(ms)} ms`;
  if (ms < 10_000) return `${(ms / 1000).toFixed(2)} s`;
  return formatDuration(ms / 1000);
}
