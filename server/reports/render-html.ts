/**
 * The printable analysis report: one self-contained HTML page (inline CSS, inline SVG, no scripts, nothing
 * loaded from anywhere) that prints on A4 or Letter. Used by GET /api/revisions/:id/report.html and by the
 * release bundle (issue 7). Every number shown comes from the stored AnalysisReport; every string is escaped.
 */
import type { AnalysisReport, LimitCheck, PlotTrace, TableReport } from "../../shared/dsp/analysis";
import type { ReportHeader } from "../../shared/schemas/analyses";
import { gainText, wordText } from "../../shared/report-format";
import { verdictOf } from "../../shared/report-words";
import { datapathSection } from "./datapath-html";
import { escapeHtml as e } from "./escape";
import { db, plain, si } from "./format";
import { LIMIT_METRIC, formatMetric, labelOf } from "./metrics";
import { linePlot, type HLine, type Series } from "./svg-plot";
import { REPORT_CSS } from "./style";

const FLOOR_DB = -120;
const hz = (v: number) => si(v, "Hz");

function verdict(pass: boolean | null): string {
  if (pass === null) return `<td class="verdict">\u2014</td>`;
  return pass ? `<td class="verdict pass">pass</td>` : `<td class="verdict fail">fail</td>`;
}

function limitText(c: LimitCheck): string {
  const bound = LIMIT_METRIC[c.name]?.bound === "min" ? "\u2265" : "\u2264";
  return `${bound} ${db(c.limit)}`;
}

/** The worst table's SQNR, as the limit check uses it. */
function worstSqnr(tables: TableReport[]): number | null {
  const v = tables.map((t) => t.coefficientSqnrDb).filter((x): x is number => x !== null);
  return v.length ? Math.min(...v) : null;
}

function metricsTable(r: AnalysisReport): string {
  const keys = [...new Set([...Object.keys(r.float), ...Object.keys(r.fixed)])];
  const checks = new Map(r.limits.map((c) => [LIMIT_METRIC[c.name]?.metric ?? c.name, c]));
  const rows = keys.map((k) => {
    const c = checks.get(k);
    return `<tr><th scope="row">${e(labelOf(k))}<span class="key">${e(k)}</span></th>
<td class="num">${e(formatMetric(k, r.float[k]))}</td><td class="num">${e(formatMetric(k, r.fixed[k]))}</td>
<td class="num">${e(k in r.diff ? formatMetric(k, r.diff[k]) : "\u2014")}</td>
<td class="num">${c ? e(limitText(c)) : "\u2014"}</td>${verdict(c ? c.pass : null)}</tr>`;
  });
  const sq = checks.get("coefficientSqnrDb");
  rows.push(`<tr><th scope="row">${e(labelOf("coefficientSqnrDb"))}<span class="key">coefficientSqnrDb</span></th>
<td class="num">\u2014</td><td class="num">${e(formatMetric("coefficientSqnrDb", worstSqnr(r.tables)))}</td><td class="num">\u2014</td>
<td class="num">${sq ? e(limitText(sq)) : "\u2014"}</td>${verdict(sq ? sq.pass : null)}</tr>`);
  return `<table class="metrics"><thead><tr><th scope="col">Figure</th><th scope="col">Float</th><th scope="col">Fixed</th>
<th scope="col">Difference</th><th scope="col">Limit</th><th scope="col">Verdict</th></tr></thead><tbody>${rows.join("\n")}</tbody></table>`;
}

function qFormat(t: TableReport): string {
  return wordText(t.fixedPoint);
}

function tablesTable(r: AnalysisReport): string {
  const rows = r.tables.map(
    (
      t,
    ) => `<tr><th scope="row">${e(t.role)}</th><td class="num">${e(plain(t.length))}</td><td>${t.complex ? "complex" : "real"}</td>
<td>${e(qFormat(t))}</td><td>${e(`${t.fixedPoint.scaling}, ${t.fixedPoint.rounding}, ${t.fixedPoint.overflow}`)}</td>
<td class="num">${e(gainText(t.gain))}</td><td class="num">${e(plain(t.overflowCount))}</td>
<td class="num">${e(formatMetric("coefficientSqnrDb", t.coefficientSqnrDb))}</td>
<td class="num">${t.accumulator ? e(`${t.accumulator.recommendedBits} bits`) : "\u2014"}</td></tr>`,
  );
  return `<table><thead><tr><th scope="col">Table</th><th scope="col">Length</th><th scope="col">Values</th><th scope="col">Format</th>
<th scope="col">Scaling, rounding, overflow</th><th scope="col">Gain</th><th scope="col">Overflows</th><th scope="col">Coefficient SQNR</th>
<th scope="col">Accumulator</th></tr></thead><tbody>${rows.join("\n")}</tbody></table>`;
}

function accumulatorText(r: AnalysisReport): string {
  const lines = r.tables
    .filter((t) => t.accumulator)
    .map((t) => {
      const a = t.accumulator!;
      return `<p>Table <b>${e(t.role)}</b>: with ${e(a.inputBits)}-bit input samples and ${e(t.fixedPoint.wordLength)}-bit coefficients the
worst-case sum needs <b class="num">${e(a.worstCaseBits)} bits</b> (input bits + coefficient bits + \u2308log2 \u03a3|\u0125|\u2309);
use an accumulator of at least <b class="num">${e(a.recommendedBits)} bits</b> so no sum can overflow.</p>`;
    });
  return lines.length
    ? lines.join("\n")
    : "<p>No accumulator figure: the receive table is unsigned or absent.</p>";
}

function dopplerTable(r: AnalysisReport): string {
  if (!r.doppler) return "";
  const row = (name: string, d: NonNullable<AnalysisReport["doppler"]>["float"]) =>
    `<tr><th scope="row">${name}</th><td class="num">${e(db(d.peakLossDb))}</td><td class="num">${e(db(d.pslDb))}</td>
<td class="num">${e(`${plain(d.rangeShiftSamples)} samples`)}</td><td class="num">${e(si(d.rangeShiftSeconds, "s"))}</td><td class="num">${e(si(d.rangeShiftMetres, "m"))}</td></tr>`;
  return `<h2>Doppler tolerance at ${e(si(r.doppler.float.dopplerHz, "Hz"))}</h2>
<table><thead><tr><th scope="col"></th><th scope="col">Peak loss vs zero Doppler</th><th scope="col">PSL</th><th scope="col">Range shift</th>
<th scope="col">(time)</th><th scope="col">(range)</th></tr></thead><tbody>${row("Float", r.doppler.float)}${row("Fixed", r.doppler.fixed)}</tbody></table>`;
}

function figure(svg: string, caption: string): string {
  return `<figure>${svg}<figcaption>${e(caption)}</figcaption></figure>`;
}

function pair(t: PlotTrace | undefined): Series[] {
  if (!t) return [];
  return [
    { x: t.x, y: t.floatDb, label: "float", cls: "float" },
    { x: t.x, y: t.fixedDb, label: "fixed", cls: "fixed" },
  ];
}

function limitLine(r: AnalysisReport, name: string, label: string, range?: [number, number]): HLine[] {
  const c = r.limits.find((l) => l.name === name);
  if (!c) return [];
  return [{ y: c.limit, label, cls: "limit-line", ...(range ? { x0: range[0], x1: range[1] } : {}) }];
}

function plots(r: AnalysisReport): string {
  const out: string[] = [];
  const p = r.plots;
  if (r.kind === "waveform") {
    const psl = limitLine(r, "pslDbMax", "PSL limit");
    out.push(
      figure(
        linePlot({
          title: "Compressed output",
          xLabel: "delay from the target (samples)",
          yLabel: "|y| (dB re float peak)",
          series: pair(p.compressed),
          hLines: psl,
          yFloor: FLOOR_DB,
          yMax: 3,
        }),
        "Compressed output, float and fixed overlaid (min/max envelope per column), dB relative to the float peak.",
      ),
    );
    out.push(
      figure(
        linePlot({
          title: "Mainlobe close-up",
          xLabel: "delay from the target (samples)",
          yLabel: "|y| (dB re float peak)",
          series: pair(p.mainlobe),
          hLines: psl,
          yFloor: FLOOR_DB,
          yMax: 3,
        }),
        `Mainlobe close-up at the full \u00d7${r.interpolation} resolution.`,
      ),
    );
    if (p.spectrum)
      out.push(
        figure(
          linePlot({
            title: "Transmit spectrum",
            xLabel: "frequency",
            xTick: hz,
            yLabel: "|S(f)|\u00b2 (dB re float peak)",
            series: pair(p.spectrum),
            yFloor: FLOOR_DB,
            yMax: 3,
          }),
          "Spectrum of the transmit table, float and fixed (zero-padded to the convolution length).",
        ),
      );
    if (p.doppler && r.doppler)
      out.push(
        figure(
          linePlot({
            title: "Doppler cut",
            xLabel: "delay from the target (samples)",
            yLabel: "|y| (dB re zero-Doppler float peak)",
            series: pair(p.doppler),
            yFloor: FLOOR_DB,
            yMax: 3,
          }),
          `Compressed output of an echo shifted by ${si(r.doppler.float.dopplerHz, "Hz")}, float and fixed.`,
        ),
      );
  } else if (p.response) {
    const bands = r.firBands;
    const masks: HLine[] = [];
    const att = r.limits.find((l) => l.name === "stopbandAttenuationDbMin");
    const rip = r.limits.find((l) => l.name === "passbandRippleDbMax");
    for (const b of bands?.stopbands ?? [])
      if (att)
        masks.push({
          y: -att.limit,
          label: "stopband mask",
          cls: "limit-line",
          x0: Math.max(0, b[0]),
          x1: b[1],
        });
    for (const b of bands?.passbands ?? [])
      if (rip) {
        masks.push({
          y: rip.limit / 2,
          label: "passband ripple mask",
          cls: "mask-line",
          x0: Math.max(0, b[0]),
          x1: b[1],
        });
        masks.push({
          y: -rip.limit / 2,
          label: "passband ripple mask",
          cls: "mask-line",
          x0: Math.max(0, b[0]),
          x1: b[1],
        });
      }
    out.push(
      figure(
        linePlot({
          title: "FIR magnitude response",
          xLabel: "frequency",
          xTick: hz,
          yLabel: "|H(f)| (dB re passband)",
          series: pair(p.response),
          hLines: masks,
          yFloor: FLOOR_DB,
          yMax: 3,
        }),
        "Magnitude response, float and fixed, with the stopband mask (attenuation limit) and the passband ripple window (\u00b1 half the ripple limit).",
      ),
    );
  }
  for (const [role, t] of Object.entries(r.coefficientErrorLsb ?? {})) {
    const series: Series[] = [{ x: t.x, y: t.re, label: "I error", cls: "float" }];
    if (t.im.some((v) => v !== 0)) series.push({ x: t.x, y: t.im, label: "Q error", cls: "fixed" });
    out.push(
      figure(
        linePlot({
          title: `Coefficient error, ${role}`,
          xLabel: "coefficient index",
          yLabel: "error (LSB)",
          series,
        }),
        `Quantization error of table ${role} in LSB of its format, (\u0125 \u2212 g\u00b7h)\u00b72^F; within \u00b10.5 LSB when nothing overflows.`,
      ),
    );
  }
  return out.join("\n");
}

const SWEEP_FIGURES = [
  "pslDb",
  "islrDb",
  "stopbandAttenuationDb",
  "passbandRippleDb",
  "coefficientSqnrDb",
  "peakLossDb",
] as const;
const SWEEP_LIMIT: Record<string, string> = {
  pslDb: "pslDbMax",
  islrDb: "islrDbMax",
  stopbandAttenuationDb: "stopbandAttenuationDbMin",
  passbandRippleDb: "passbandRippleDbMax",
  coefficientSqnrDb: "coefficientSqnrDbMin",
  peakLossDb: "peakLossDbMax",
};

function sweepSection(r: AnalysisReport): string {
  const s = r.sweep;
  if (!s || s.rows.length === 0) return "";
  const ws = s.rows.map((row) => row.wordLength);
  // Without limits every W "passes" vacuously: nothing is judged, so nothing is recommended.
  const judged = verdictOf(r) !== "not-judged";
  const best = judged ? s.smallestPassingWordLength : null;
  const figs = SWEEP_FIGURES.filter((k) => s.rows.some((row) => typeof row.figures[k] === "number"));
  const svgs = figs.map((k) => {
    const pts = s.rows.filter((row) => typeof row.figures[k] === "number");
    const series: Series[] = [
      {
        x: pts.map((row) => row.wordLength),
        y: pts.map((row) => row.figures[k]!),
        label: labelOf(k),
        cls: "fixed",
        markers: true,
      },
    ];
    const vLines = best === null ? [] : [{ x: best, label: `recommended W = ${best}`, cls: "best" }];
    return figure(
      linePlot({
        title: `${labelOf(k)} vs word length`,
        xLabel: "word length W (bits)",
        yLabel: "dB",
        series,
        hLines: limitLine(r, SWEEP_LIMIT[k]!, "limit"),
        vLines,
        height: 200,
      }),
      `${labelOf(k)} against W (${s.tables.join(", ")} swept; integer bits W \u2212 F kept).`,
    );
  });
  const head = figs.map((k) => `<th scope="col">${e(labelOf(k))}</th>`).join("");
  const rows = s.rows
    .map(
      (
        row,
      ) => `<tr${row.wordLength === best ? ' class="best"' : ""}><th scope="row" class="num">${e(row.wordLength)}</th>
${figs.map((k) => `<td class="num">${e(formatMetric(k, row.figures[k]))}</td>`).join("")}<td>${e(row.method)}</td>${verdict(judged ? row.pass : null)}</tr>`,
    )
    .join("\n");
  return `<h2>Bit-width sweep</h2>
<p>Word lengths ${e(Math.min(...ws))} to ${e(Math.max(...ws))} on table(s) ${e(s.tables.join(", "))}. ${
    !judged
      ? "<b>No acceptance limits were set: no word length is judged or recommended.</b>"
      : best === null
        ? "<b>No word length in the range meets every acceptance limit.</b>"
        : `The smallest word length that meets every acceptance limit is <b class="num">W = ${e(best)}</b>.`
  }</p>
${svgs.join("\n")}
<table class="sweep"><thead><tr><th scope="col">W</th>${head}<th scope="col">Method</th><th scope="col">Verdict</th></tr></thead><tbody>${rows}</tbody></table>`;
}

function assumptions(r: AnalysisReport): string {
  const items = [
    `Mismatch (SNR) loss assumes white noise at the receiver input: it compares the receive filter with the ideal matched filter for white noise.`,
    r.kind === "waveform"
      ? `Compressed outputs are measured after interpolating by U = ${r.interpolation} (zero-padding the spectrum); the mainlobe runs from the peak to the first local minimum on each side of that grid, and all other samples are sidelobes.`
      : `The frequency response is evaluated on the report's response grid; bands are judged on |f| for real taps.`,
    r.doppler
      ? `The Doppler cut uses an echo shifted by ${si(r.doppler.float.dopplerHz, "Hz")} and the unchanged receive filter; its losses are relative to the zero-Doppler peak of the same filter.`
      : `No Doppler value was given, so no Doppler cut was computed.`,
    `"Fixed" figures use the quantized tables' represented values divided by their gain (\u0125/g), so a gain from scaling does not count as a loss.`,
    `The coefficient SQNR limit is checked against the worst table.`,
    `Sample rate ${si(r.sampleRateHz, "Hz")}; report layout version ${r.version}.`,
  ];
  return `<ul>${items.map((i) => `<li>${e(i)}</li>`).join("")}</ul>`;
}

function definitions(r: AnalysisReport): string {
  const rows = Object.entries(r.definitions).map(
    ([k, v]) => `<dt>${e(labelOf(k))} <span class="key">${e(k)}</span></dt><dd>${e(v)}</dd>`,
  );
  return `<dl>${rows.join("")}</dl>`;
}

/** Render the printable report page. */
export function renderReportHtml(header: ReportHeader, report: AnalysisReport): string {
  const failing = report.limits
    .filter((c) => !c.pass)
    .map((c) => labelOf(LIMIT_METRIC[c.name]?.metric ?? c.name));
  const overall =
    report.limits.length === 0
      ? `<p class="banner none">Not judged: no acceptance limits were set.</p>`
      : report.pass
        ? `<p class="banner pass">All ${report.limits.length} acceptance limits pass.</p>`
        : `<p class="banner fail">${failing.length} of ${report.limits.length} acceptance limits fail: ${e(failing.join(", "))}.</p>`;
  const headerRows: [string, string][] = [
    ["Project", header.project],
    ["Design", header.design],
    ["Revision", header.revision],
    ["Content hash", header.contentHash],
    ["Generated at", header.generatedAt],
    ["Software version", header.softwareVersion],
  ];
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${e(`${header.design} ${header.revision} \u2014 fixed-point analysis report`)}</title>
<style>${REPORT_CSS}</style></head>
<body><main>
<header class="page-head"><p class="mark">Tapwright</p><h1>Fixed-point analysis report</h1>
<table class="header">${headerRows.map(([k, v]) => `<tr><th scope="row">${e(k)}</th><td class="${k === "Content hash" ? "hash" : ""}">${e(v)}</td></tr>`).join("")}</table></header>
${overall}
<h2>Figures and acceptance limits</h2>
${metricsTable(report)}
<h2>Coefficient tables</h2>
${tablesTable(report)}
<h2>Accumulator</h2>
${accumulatorText(report)}
${datapathSection(report)}
${dopplerTable(report)}
<h2>Plots</h2>
${plots(report)}
${sweepSection(report)}
<h2>Assumptions</h2>
${assumptions(report)}
<h2>Definitions</h2>
${definitions(report)}
<footer><p>${e(`${header.project} \u00b7 ${header.design} \u00b7 ${header.revision} \u00b7 ${header.contentHash}`)}</p></footer>
</main></body></html>
`;
}
