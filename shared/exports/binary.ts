/**
 * The raw little-endian binary export: each word in the smallest of 8, 16 or 32 bits that holds W
 * (signed two's complement, or unsigned for an unsigned spec), real tables I only, complex tables
 * I then Q per tap (I0 Q0 I1 Q1 …). No header: the manifest states W, F and the layout.
 */
import type { ExportContext } from "./context";

/** Renders the binary file of a context; byte length = taps × (complex ? 2 : 1) × storage_bits/8. */
export function renderBinary(ctx: ExportContext): Uint8Array {
  const bytes = ctx.spec.storage_bits / 8;
  const perTap = ctx.table.complex ? 2 : 1;
  const out = new Uint8Array(ctx.taps.length * perTap * bytes);
  const view = new DataView(out.buffer);
  const put = (offset: number, v: number) => {
    if (bytes === 1) {
      if (ctx.spec.signed) view.setInt8(offset, v);
      else view.setUint8(offset, v);
    } else if (bytes === 2) {
      if (ctx.spec.signed) view.setInt16(offset, v, true);
      else view.setUint16(offset, v, true);
    } else if (ctx.spec.signed) view.setInt32(offset, v, true);
    else view.setUint32(offset, v, true);
  };
  let o = 0;
  for (const tap of ctx.taps) {
    put(o, tap.i);
    o += bytes;
    if (perTap === 2) {
      put(o, tap.q);
      o += bytes;
    }
  }
  return out;
}
