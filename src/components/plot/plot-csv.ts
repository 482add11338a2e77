/** CSV of plotted data: one x column and one column per series, values at round-trip precision. */

/** An axis or series name with its unit ("" for none). */
export interface Labelled {
  label: string;
  unit: string;
}

const heading = ({ label, unit }: Labelled) => {
  const text = unit ? `${label} (${unit})` : label;
  // RFC 4180: quote a field that holds a comma, a quote or a line break.
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
};

/**
 * RFC 4180 CSV (CRLF line ends). Numbers use JavaScript's shortest round-trip form, so reading a value back
 * gives the same float64 that was plotted.
 */
export function plotCsv(
  x: Labelled,
  series: readonly Labelled[],
  xs: ArrayLike<number>,
  ys: readonly ArrayLike<number>[],
): string {
  const lines = [[x, ...series].map(heading).join(",")];
  for (let i = 0; i < xs.length; i++) {
    const row = [String(xs[i])];
    for (const y of ys) row.push(String(y[i]));
    lines.push(row.join(","));
  }
  return `${lines.join("\r\n")}\r\n`;
}
