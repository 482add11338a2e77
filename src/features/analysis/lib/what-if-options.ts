/** Choices of the what-if panel, in the words of DESIGN.md and REFERENCES.md (IEEE 754 / VHDL fixed_pkg names). */
import type { WindowSpecSchema } from "@shared/schemas/analysis";
import type { z } from "zod";

type WindowSpec = z.infer<typeof WindowSpecSchema>;
/** A receive-window kind. */
export type WindowKind = WindowSpec["kind"];

/** Rounding modes as DESIGN.md names them. */
export const ROUNDING_LABELS = {
  "nearest-even": "nearest, ties even",
  "nearest-away": "nearest, ties away",
  "nearest-up": "nearest, ties up",
  floor: "floor (truncate)",
  ceiling: "ceiling (toward +∞)",
  "toward-zero": "toward zero",
} as const;

/** Window kinds in the order people reach for them. */
export const WINDOW_LABELS: Record<WindowKind, string> = {
  rectangular: "rectangular (matched)",
  hann: "Hann",
  hamming: "Hamming",
  blackman: "Blackman",
  "blackman-harris": "Blackman-Harris",
  kaiser: "Kaiser",
  chebyshev: "Dolph-Chebyshev",
  taylor: "Taylor",
};

/** Starting parameters when a parametric window is picked (common practice for radar receive weighting). */
export const DEFAULT_WINDOW_PARAMS = { beta: 6, attenuationDb: 60, nbar: 5, sidelobeDb: -35 } as const;

/** A complete window spec of `kind`, filling its parameters from `p`. */
export function windowOf(
  kind: WindowKind,
  p: { beta: number; attenuationDb: number; nbar: number; sidelobeDb: number },
): WindowSpec {
  switch (kind) {
    case "kaiser":
      return { kind, beta: p.beta };
    case "chebyshev":
      return { kind, attenuationDb: p.attenuationDb };
    case "taylor":
      return { kind, nbar: p.nbar, sidelobeDb: p.sidelobeDb };
    default:
      return { kind };
  }
}
