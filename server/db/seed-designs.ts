// Demo designs of the fictional Coastwatch-S programme (issue 4): created through the authoring service so
// their tables are materialized exactly as the API would; idempotent (an existing name is left alone).
import { and, eq } from "drizzle-orm";
import { CreateDesignSchema, type CreateDesignInput } from "../../shared/schemas/designs";
import { createDesign } from "../services/designs";
import type { Db } from "./client";
import { designs, projects, users } from "./schema";

const q = (wordLength: number) => ({
  wordLength,
  fractionLength: wordLength - 1,
  scaling: "full-scale" as const,
});

/** The demo designs; limits are the programme's invented acceptance figures. */
export const DEMO_DESIGNS: readonly CreateDesignInput[] = [
  {
    name: "Long-pulse LFM, 10 MHz / 50 µs, Taylor receive",
    description:
      "Long pulse for the instrumented range; Taylor n̄ = 6, −35 dB receive weighting against range sidelobes.",
    content: {
      kind: "waveform",
      tx: { kind: "lfm", bandwidthHz: 10e6, pulseWidthS: 50e-6, sampleRateHz: 12.5e6 },
      rx: { window: { kind: "taylor", nbar: 6, sidelobeDb: -35 } },
      fixedPoint: { tx: q(16), rx: q(16) },
      limits: {
        pslDbMax: -32,
        islrDbMax: -25,
        mismatchLossDbMax: 1.5,
        peakLossDbMax: 0.1,
        coefficientSqnrDbMin: 70,
      },
    },
  },
  {
    name: "Short pulse Barker-13",
    description:
      "Fills the blind zone of the long pulse: 13 chips of 200 ns, sampled at 20 MHz (4 samples per chip).",
    content: {
      kind: "waveform",
      tx: { kind: "phase-code", code: { kind: "barker", length: 13 }, samplesPerChip: 4, sampleRateHz: 20e6 },
      fixedPoint: { tx: q(12), rx: q(12) },
      // Barker-13's peak sidelobe is 1/13, −22.3 dB (Richards 2014, Table 4.1). Several samples per chip keep the
      // band-limited ×8 interpolation close to it; at one sample per chip it would read about −15 dB.
      limits: { pslDbMax: -20, peakLossDbMax: 0.1 },
    },
  },
  {
    name: "Low-sidelobe NLFM",
    description:
      "Study waveform: stationary-phase NLFM with a Taylor-shaped spectrum, matched receive (no weighting loss).",
    content: {
      kind: "waveform",
      tx: {
        kind: "nlfm",
        bandwidthHz: 5e6,
        pulseWidthS: 100e-6,
        sampleRateHz: 6.25e6,
        window: { kind: "taylor", nbar: 7, sidelobeDb: -40 },
      },
      fixedPoint: { tx: q(16), rx: q(16) },
      limits: { pslDbMax: -30, mismatchLossDbMax: 0.5, coefficientSqnrDbMin: 70 },
    },
  },
  {
    name: "4:1 decimation FIR",
    description: "Anti-alias low-pass ahead of the 4:1 decimator after the 100 MHz ADC.",
    content: {
      kind: "filter",
      fir: {
        kind: "design",
        band: "lowpass",
        sampleRateHz: 100e6,
        cutoffHz: 10e6,
        transitionHz: 5e6,
        stopbandAttenuationDb: 70,
      },
      fixedPoint: { fir: q(18) },
      limits: { stopbandAttenuationDbMin: 65, passbandRippleDbMax: 0.1, coefficientSqnrDbMin: 70 },
    },
  },
];

/** Add the demo designs to project coastwatch-s, owned by the demo author (skips names that exist). */
export async function seedDemoDesigns(db: Db): Promise<void> {
  const [project] = await db
    .select({ id: projects.id })
    .from(projects)
    .where(eq(projects.slug, "coastwatch-s"));
  const [author] = await db.select({ id: users.id }).from(users).where(eq(users.username, "author"));
  if (!project || !author) return;
  for (const d of DEMO_DESIGNS) {
    const [existing] = await db
      .select({ id: designs.id })
      .from(designs)
      .where(and(eq(designs.projectId, project.id), eq(designs.name, d.name)));
    if (existing) continue;
    await createDesign(db, { id: author.id, roles: ["author"] }, project.id, CreateDesignSchema.parse(d));
  }
}
