/**
 * Revision content → coefficient tables, with the DSP core. Pure: uploads arrive already parsed, so the
 * same content always gives the same bytes (the content hash depends on it).
 */
import { createHash } from "node:crypto";
import type { FirSource } from "../../shared/schemas/analysis";
import type { RevisionContent, TableRole } from "../../shared/schemas/designs";
import { designFir } from "../../shared/dsp/fir-design";
import { generateWaveform } from "../../shared/dsp/analysis";
import { matchedFilter } from "../../shared/dsp/matched-filter";
import type { ComplexSignal } from "../../shared/dsp/types";

/** An upload's parsed values, as materialization needs them. */
export interface ParsedUpload {
  id: number;
  fileName: string;
  sha256: string;
  format: string;
  complex: boolean;
  re: Float64Array;
  im: Float64Array;
}

/** One table ready to insert. */
export interface MaterializedTable {
  role: TableRole;
  position: number;
  complex: boolean;
  length: number;
  sampleRateHz: number;
  source: Record<string, unknown>;
  values: Buffer;
  valuesSha256: string;
}

/** A generator refused its parameters; `path` points into the revision content. */
export class MaterializeError extends Error {
  constructor(
    message: string,
    readonly path: (string | number)[],
  ) {
    super(message);
    this.name = "MaterializeError";
  }
}

/** Interleaved little-endian float64 [re0, im0, re1, im1, …] (the stored and downloaded layout). */
export function encodeValues(s: ComplexSignal): Buffer {
  const n = s.re.length;
  const buf = Buffer.alloc(16 * n);
  for (let i = 0; i < n; i++) {
    buf.writeDoubleLE(s.re[i]!, 16 * i);
    buf.writeDoubleLE(s.im[i]!, 16 * i + 8);
  }
  return buf;
}

/** The inverse of encodeValues. */
export function decodeValues(buf: Uint8Array): ComplexSignal {
  if (buf.byteLength % 16 !== 0)
    throw new RangeError(`values hold ${buf.byteLength} bytes, not a multiple of 16`);
  const view = new DataView(buf.buffer, buf.byteOffset, buf.byteLength);
  const n = buf.byteLength / 16;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    re[i] = view.getFloat64(16 * i, true);
    im[i] = view.getFloat64(16 * i + 8, true);
  }
  return { re, im };
}

const hasImaginary = (s: ComplexSignal) => s.im.some((v) => v !== 0);

function table(
  role: TableRole,
  position: number,
  signal: ComplexSignal,
  complex: boolean,
  sampleRateHz: number,
  source: Record<string, unknown>,
): MaterializedTable {
  const values = encodeValues(signal);
  return {
    role,
    position,
    complex,
    length: signal.re.length,
    sampleRateHz,
    source,
    values,
    valuesSha256: createHash("sha256").update(values).digest("hex"),
  };
}

function uploadSource(u: ParsedUpload): Record<string, unknown> {
  return { kind: "upload", uploadId: u.id, fileName: u.fileName, sha256: u.sha256, format: u.format };
}

function run<T>(path: (string | number)[], fn: () => T): T {
  try {
    return fn();
  } catch (e) {
    if (e instanceof RangeError || e instanceof TypeError) throw new MaterializeError(e.message, path);
    throw e;
  }
}

function firTaps(src: Extract<FirSource, { kind: "design" }>): ComplexSignal {
  const taps = designFir(src).taps;
  return { re: taps, im: new Float64Array(taps.length) };
}

/**
 * The tables of a revision: waveform → `tx` (generator or upload) and `rx` = matchedFilter(tx, rx.window);
 * filter → `fir` (windowed-sinc design or upload). `upload(id)` returns the parsed upload or undefined.
 */
export function materialize(
  content: RevisionContent,
  upload: (id: number) => ParsedUpload | undefined,
): MaterializedTable[] {
  const uploaded = (id: number, path: (string | number)[]) => {
    const u = upload(id);
    if (!u) throw new MaterializeError(`no upload ${id} in this project`, path);
    return u;
  };
  if (content.kind === "waveform") {
    const src = content.tx;
    let signal: ComplexSignal;
    let tx: MaterializedTable;
    if (src.kind === "upload") {
      const u = uploaded(src.uploadId, ["content", "tx", "uploadId"]);
      signal = { re: u.re, im: u.im };
      tx = table("tx", 0, signal, u.complex, src.sampleRateHz, uploadSource(u));
    } else {
      signal = run(["content", "tx"], () => generateWaveform(src));
      tx = table("tx", 0, signal, hasImaginary(signal), src.sampleRateHz, { ...src });
    }
    const h = run(["content", "rx", "window"], () => matchedFilter(signal, content.rx.window));
    // The matched filter of a real waveform is real.
    const rx = table("rx", 1, h, tx.complex, tx.sampleRateHz, {
      kind: "matched-filter",
      of: "tx",
      window: content.rx.window,
    });
    return [tx, rx];
  }
  const src = content.fir;
  if (src.kind === "upload") {
    const u = uploaded(src.uploadId, ["content", "fir", "uploadId"]);
    return [
      table("fir", 0, { re: u.re, im: u.im }, u.complex, src.sampleRateHz, {
        ...uploadSource(u),
        passbands: src.passbands,
        stopbands: src.stopbands,
      }),
    ];
  }
  const taps = run(["content", "fir"], () => firTaps(src));
  return [table("fir", 0, taps, false, src.sampleRateHz, { ...src })];
}

/** The upload ids a content refers to. */
export function uploadIdsOf(content: RevisionContent): number[] {
  if (content.kind === "waveform") return content.tx.kind === "upload" ? [content.tx.uploadId] : [];
  return content.fir.kind === "upload" ? [content.fir.uploadId] : [];
}

/** materialize in a CPU thread (server/jobs/cpu-pool.ts): generators and matched filters of long pulses take seconds. */
export async function materializeOffThread(
  content: RevisionContent,
  uploads: ParsedUpload[],
): Promise<MaterializedTable[]> {
  const { cpuPool } = await import("../jobs/cpu-pool");
  const tables = await cpuPool().run("materialize", { content, uploads });
  // Buffers cross the thread boundary as plain Uint8Arrays.
  return tables.map((t) => ({
    ...t,
    values: Buffer.from(t.values.buffer, t.values.byteOffset, t.values.byteLength),
  }));
}
