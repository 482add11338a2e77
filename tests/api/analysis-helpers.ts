// Helpers shared by the analysis API tests: designs to analyse, a worker over the test database, polling.
import { expect } from "vitest";
import pino from "pino";
import type { Database } from "../../server/db/client";
import { parseJobsConfig, type JobsConfig } from "../../server/jobs/config";
import { startAnalysisWorker, type AnalysisWorker } from "../../server/jobs/worker";
import { AnalysisResponseSchema, type AnalysisStatus } from "../../shared/schemas/analyses";
import { CreatedDesignSchema } from "../../shared/schemas/designs";
import { projectId } from "./designs-helpers";
import type { ApiTestContext, Agent } from "./helpers";

/** A Taylor-weighted LFM (the docs/analysis.md worked example 1): 2 MHz, 100 µs, fs 2.5 MHz, N = 250. */
export const taylorLfm = {
  kind: "waveform",
  tx: { kind: "lfm", bandwidthHz: 2e6, pulseWidthS: 100e-6, sampleRateHz: 2.5e6 },
  rx: { window: { kind: "taylor", nbar: 5, sidelobeDb: -35 } },
  fixedPoint: { tx: { wordLength: 14, fractionLength: 13 }, rx: { wordLength: 12, fractionLength: 11 } },
  dopplerHz: 5000,
  limits: {
    pslDbMax: -33,
    islrDbMax: -22,
    mismatchLossDbMax: 1.5,
    peakLossDbMax: 0.1,
    coefficientSqnrDbMin: 60,
  },
  sweep: { minBits: 6, maxBits: 16 },
};

/** A long complex LFM with a sweep: `samples` = 10 MHz × T at fs 12.5 MHz (65,536 for the demo-sized pulse). */
export function longLfm(samples: number, sweep = true) {
  return {
    kind: "waveform",
    tx: { kind: "lfm", bandwidthHz: 10e6, pulseWidthS: samples / 12.5e6, sampleRateHz: 12.5e6 },
    rx: { window: { kind: "taylor", nbar: 5, sidelobeDb: -35 } },
    fixedPoint: { tx: { wordLength: 14, fractionLength: 13 }, rx: { wordLength: 12, fractionLength: 11 } },
    limits: { pslDbMax: -34, islrDbMax: -25, coefficientSqnrDbMin: 50 },
    ...(sweep ? { sweep: { minBits: 6, maxBits: 16 } } : {}),
  };
}

let n = 0;
/** Create a design in a project (by slug) as `agent`; returns its r1 draft's id. */
export async function newDesign(t: ApiTestContext, agent: Agent, content: object, slug = "coastwatch-s") {
  const pid = await projectId(t.app, slug);
  const res = await agent
    .post(`/api/projects/${pid}/designs`)
    .send({ name: `analysis test ${process.pid}-${++n}`, content });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return CreatedDesignSchema.parse(res.body);
}

/** Fast polling and maintenance, so tests need not wait for production intervals. */
export function testJobsConfig(over: Partial<Record<keyof JobsConfig, string>> = {}): JobsConfig {
  return parseJobsConfig({ ANALYSIS_POLL_SECONDS: "0.5", ANALYSIS_MAINTENANCE_SECONDS: "1", ...over });
}

/** An in-process worker over the test database. */
export function testWorker(database: Database, config = testJobsConfig()): Promise<AnalysisWorker> {
  return startAnalysisWorker({
    database,
    config,
    softwareVersion: "test-worker",
    logger: pino({ level: process.env.TEST_WORKER_LOG ?? "silent" }),
  });
}

/** GET the analysis until `until` holds (or the time runs out). */
export async function pollAnalysis(
  agent: Agent,
  revisionId: number,
  until: (a: AnalysisStatus | null) => boolean,
  timeoutMs = 60_000,
): Promise<AnalysisStatus | null> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const res = await agent.get(`/api/revisions/${revisionId}/analysis`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const a = AnalysisResponseSchema.parse(res.body).analysis;
    if (until(a)) return a;
    if (Date.now() > deadline)
      throw new Error(`analysis still ${JSON.stringify(a && { ...a, report: undefined })}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}
