/**
 * The mapping layer between the new-design form (MHz, µs, NaN for empty) and the API's CreateDesignInput
 * (Hz, s, absent for "not given"), and back for error paths: an issue at `content.tx.bandwidthHz` belongs to
 * the form field `lfm.bandwidthMHz`. Validation itself is CreateDesignSchema, the server's own schema.
 */
import type { CreateDesignInput, RevisionContentInput } from "@shared/schemas/designs";
import type { WindowSpec } from "@shared/dsp/windows";
import type { DesignFormValues, FixedPointFields, LimitFields, WindowFields } from "./form-values";
import { given, mhzToHz, usToS } from "./units";

/** The window spec of the chosen kind, with only that kind's parameters. */
export function toWindowSpec(w: WindowFields): WindowSpec {
  switch (w.kind) {
    case "kaiser":
      return { kind: "kaiser", beta: w.beta };
    case "chebyshev":
      return { kind: "chebyshev", attenuationDb: w.attenuationDb };
    case "taylor":
      return { kind: "taylor", nbar: w.nbar, sidelobeDb: w.sidelobeDb };
    default:
      return { kind: w.kind };
  }
}

const hz = (mhz: number) => (given(mhz) === undefined ? undefined : mhzToHz(mhz));

function limitsOf(l: LimitFields): Partial<Record<keyof LimitFields, number>> {
  const out: Partial<Record<keyof LimitFields, number>> = {};
  for (const [k, v] of Object.entries(l) as Array<[keyof LimitFields, number]>)
    if (given(v) !== undefined) out[k] = v;
  return out;
}

const fixedOf = (f: FixedPointFields) => ({ ...f });

/** Sample rate of a phase-coded pulse in Hz: the chip rate times samples per chip, or the rate as given. */
export function phaseCodeSampleRateHz(p: DesignFormValues["phaseCode"]): number | undefined {
  const rate = hz(p.rateMHz);
  if (rate === undefined) return undefined;
  return p.rateBasis === "chip" ? rate * p.samplesPerChip : rate;
}

function phaseCodeSpec(p: DesignFormValues["phaseCode"]) {
  if (p.code === "barker") return { kind: "barker" as const, length: p.barkerLength as 13 };
  if (p.code === "p3" || p.code === "p4") return { kind: p.code, length: p.length };
  return { kind: p.code, order: p.order };
}

// Values the schema will refuse (NaN from an empty box) are passed as `undefined` so the schema names them.
type Loose<T> = { [K in keyof T]: T[K] | undefined };

function waveformContent(v: DesignFormValues): Loose<Extract<RevisionContentInput, { kind: "waveform" }>> {
  let tx: unknown;
  if (v.source === "upload") {
    tx = { kind: "upload", uploadId: given(v.upload.uploadId), sampleRateHz: hz(v.upload.sampleRateMHz) };
  } else if (v.generator === "lfm") {
    const l = v.lfm;
    tx = {
      kind: "lfm",
      bandwidthHz: hz(l.bandwidthMHz),
      pulseWidthS: given(l.pulseWidthUs) === undefined ? undefined : usToS(l.pulseWidthUs),
      sampleRateHz: hz(l.sampleRateMHz),
      direction: l.direction,
      output: l.output,
      ...(l.output === "real" ? { intermediateFrequencyHz: hz(l.intermediateFrequencyMHz) } : {}),
    };
  } else if (v.generator === "nlfm") {
    const n = v.nlfm;
    tx = {
      kind: "nlfm",
      bandwidthHz: hz(n.bandwidthMHz),
      pulseWidthS: given(n.pulseWidthUs) === undefined ? undefined : usToS(n.pulseWidthUs),
      sampleRateHz: hz(n.sampleRateMHz),
      window: toWindowSpec(n.window),
    };
  } else {
    tx = {
      kind: "phase-code",
      code: phaseCodeSpec(v.phaseCode),
      samplesPerChip: given(v.phaseCode.samplesPerChip),
      sampleRateHz: phaseCodeSampleRateHz(v.phaseCode),
    };
  }
  return {
    kind: "waveform",
    tx: tx as Extract<RevisionContentInput, { kind: "waveform" }>["tx"],
    rx: { window: toWindowSpec(v.rxWindow) },
    fixedPoint: { tx: fixedOf(v.fixedPoint.tx), rx: fixedOf(v.fixedPoint.rx) },
    limits: limitsOf(v.limits),
  } as Loose<Extract<RevisionContentInput, { kind: "waveform" }>>;
}

function filterContent(v: DesignFormValues): Loose<Extract<RevisionContentInput, { kind: "filter" }>> {
  let fir: unknown;
  if (v.source === "upload") {
    const u = v.upload;
    fir = {
      kind: "upload",
      uploadId: given(u.uploadId),
      sampleRateHz: hz(u.sampleRateMHz),
      passbands: [[hz(u.passLowMHz), hz(u.passHighMHz)]],
      stopbands: [[hz(u.stopLowMHz), hz(u.stopHighMHz)]],
    };
  } else {
    const f = v.fir;
    fir = {
      kind: "design",
      band: f.band,
      sampleRateHz: hz(f.sampleRateMHz),
      ...(f.band === "lowpass"
        ? { cutoffHz: hz(f.cutoffMHz) }
        : { lowCutoffHz: hz(f.lowCutoffMHz), highCutoffHz: hz(f.highCutoffMHz) }),
      transitionHz: hz(f.transitionMHz),
      stopbandAttenuationDb: given(f.stopbandAttenuationDb),
      ...(f.customWindow ? { window: toWindowSpec(f.window) } : {}),
      ...(given(f.taps) !== undefined ? { taps: f.taps } : {}),
    };
  }
  return {
    kind: "filter",
    fir: fir as Extract<RevisionContentInput, { kind: "filter" }>["fir"],
    fixedPoint: { fir: fixedOf(v.fixedPoint.fir) },
    limits: limitsOf(v.limits),
  } as Loose<Extract<RevisionContentInput, { kind: "filter" }>>;
}

/** The request body of POST /api/projects/:id/designs for these form values (SI units). */
export function toCreateInput(v: DesignFormValues): CreateDesignInput {
  return {
    name: v.name,
    description: v.description,
    content: (v.kind === "waveform" ? waveformContent(v) : filterContent(v)) as RevisionContentInput,
  };
}

type Path = ReadonlyArray<string | number>;

// API field → form field, per source of the transmit/FIR table.
const SI_TO_FORM: Record<string, string> = {
  bandwidthHz: "bandwidthMHz",
  pulseWidthS: "pulseWidthUs",
  sampleRateHz: "sampleRateMHz",
  intermediateFrequencyHz: "intermediateFrequencyMHz",
  cutoffHz: "cutoffMHz",
  lowCutoffHz: "lowCutoffMHz",
  highCutoffHz: "highCutoffMHz",
  transitionHz: "transitionMHz",
};

function sourcePath(v: DesignFormValues, rest: Path): string {
  const [head, ...tail] = rest.map(String);
  if (v.source === "upload") {
    if (head === "passbands" || head === "stopbands") {
      const side = head === "passbands" ? "pass" : "stop";
      return `upload.${side}${tail[1] === "1" ? "HighMHz" : "LowMHz"}`;
    }
    return `upload.${head === "sampleRateHz" ? "sampleRateMHz" : "uploadId"}`;
  }
  const group = v.kind === "filter" ? "fir" : v.generator === "phase-code" ? "phaseCode" : v.generator;
  if (head === undefined) return group;
  if (group === "phaseCode") {
    if (head === "sampleRateHz") return "phaseCode.rateMHz";
    if (head === "code") {
      const field =
        v.phaseCode.code === "barker"
          ? "barkerLength"
          : tail[0] === "order"
            ? "order"
            : tail[0] === "length"
              ? "length"
              : "code";
      return `phaseCode.${field}`;
    }
    return `phaseCode.${head}`;
  }
  if (head === "window") return tail[0] ? `${group}.window.${tail[0]}` : `${group}.window.kind`;
  return `${group}.${SI_TO_FORM[head] ?? head}`;
}

/** The form field an API issue path names (e.g. ["content","tx","bandwidthHz"] → "lfm.bandwidthMHz"); "root" when none. */
export function formPathOf(v: DesignFormValues, path: Path): string {
  const [a, b, c, ...rest] = path.map(String);
  if (a === "name" || a === "description") return a;
  if (a !== "content") return "root";
  if (b === "tx" || b === "fir")
    return sourcePath(
      v,
      [c, ...rest].filter((x): x is string => x !== undefined),
    );
  if (b === "rx") return c === "window" && rest[0] ? `rxWindow.${rest[0]}` : "rxWindow.kind";
  if (b === "fixedPoint" && c) return rest[0] ? `fixedPoint.${c}.${rest[0]}` : `fixedPoint.${c}.wordLength`;
  if (b === "limits" && c) return `limits.${c}`;
  return "root";
}
