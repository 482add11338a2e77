// Authoring API: designs created from every generator; the stored tables are checked bit for bit against
// the DSP core's generators, and the receive table against h[n] = w[n]·conj(s[N−1−n]) computed here.
import { describe, expect, it } from "vitest";
import {
  CreatedDesignSchema,
  DesignDetailSchema,
  DesignListSchema,
  RevisionDetailSchema,
} from "../../shared/schemas/designs";
import { designFir } from "../../shared/dsp/fir-design";
import { linearFm } from "../../shared/dsp/lfm";
import { nonlinearFm } from "../../shared/dsp/nlfm";
import { phaseCode, type PhaseCodeSpec } from "../../shared/dsp/phase-codes";
import { makeWindow } from "../../shared/dsp/windows";
import type { ComplexSignal } from "../../shared/dsp/types";
import { Q15, countRows, expectSameBits, projectId, tableValues } from "./designs-helpers";
import { expectError, failOnConsoleError, signedIn, useApiTestDatabase } from "./helpers";

const t = useApiTestDatabase();
failOnConsoleError();

type Agent = Awaited<ReturnType<typeof signedIn>>;

let counter = 0;
async function create(agent: Agent, content: Record<string, unknown>, name = `design ${++counter}`) {
  const pid = await projectId(t.app, "coastwatch-s");
  const res = await agent.post(`/api/projects/${pid}/designs`).send({ name, content });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  const created = CreatedDesignSchema.parse(res.body);
  const detail = RevisionDetailSchema.parse((await agent.get(`/api/revisions/${created.revision.id}`)).body);
  return { created, detail };
}

/** The matched filter written out from its definition (DESIGN.md; Richards 2014 §4.4), window w given. */
function matched(s: ComplexSignal, w: Float64Array | null): { re: Float64Array; im: Float64Array } {
  const n = s.re.length;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const g = w ? w[i]! : 1;
    re[i] = g * s.re[n - 1 - i]!;
    const q = s.im[n - 1 - i]!;
    im[i] = q === 0 ? 0 : -g * q;
  }
  return { re, im };
}

async function checkWaveform(
  agent: Agent,
  content: Record<string, unknown>,
  expected: ComplexSignal,
  opts: { complex: boolean; window?: Float64Array; sampleRateHz: number },
) {
  const { created, detail } = await create(agent, content);
  expect(created.revision).toMatchObject({ number: 1, state: "draft", contentHash: null });
  expect(detail.tables.map((x) => x.role)).toEqual(["tx", "rx"]);
  const [tx, rx] = detail.tables;
  for (const table of [tx!, rx!]) {
    expect(table.length).toBe(expected.re.length);
    expect(table.complex).toBe(opts.complex);
    expect(table.sampleRateHz).toBe(opts.sampleRateHz);
  }
  const txv = await tableValues(agent, created.revision.id, tx!.id);
  expectSameBits(txv.re, expected.re, "tx.re");
  expectSameBits(txv.im, expected.im, "tx.im");
  const h = matched(expected, opts.window ?? null);
  const rxv = await tableValues(agent, created.revision.id, rx!.id);
  expectSameBits(rxv.re, h.re, "rx.re");
  expectSameBits(rxv.im, h.im, "rx.im");
  expect(rx!.source).toMatchObject({ kind: "matched-filter", of: "tx" });
  return { created, detail };
}

describe("create a waveform design from a generator", () => {
  it("LFM, complex baseband, 10 MHz / 50 µs at 12.5 MHz with a Taylor receive window: 625 samples", async () => {
    const author = await signedIn(t.app, "author");
    const tx = { kind: "lfm", bandwidthHz: 10e6, pulseWidthS: 50e-6, sampleRateHz: 12.5e6 } as const;
    const window = { kind: "taylor", nbar: 5, sidelobeDb: -35 } as const;
    const { detail } = await checkWaveform(
      author,
      { kind: "waveform", tx, rx: { window }, fixedPoint: { tx: Q15, rx: Q15 } },
      linearFm(tx),
      { complex: true, window: makeWindow(window, 625), sampleRateHz: 12.5e6 },
    );
    // T·fs = 50e-6 × 12.5e6 = 625 samples.
    expect(detail.tables[0]!.length).toBe(625);
    // Defaults of the contract are stored, so the content is complete.
    expect(detail.content).toMatchObject({ interpolation: 8, inputBits: 14, limits: {} });
    expect(detail.canEdit).toBe(true);
  });

  it("LFM, real at an IF (down-chirp), gives real tx and rx tables", async () => {
    const author = await signedIn(t.app, "author");
    const tx = {
      kind: "lfm",
      bandwidthHz: 2e6,
      pulseWidthS: 10e-6,
      sampleRateHz: 20e6,
      direction: "down",
      output: "real",
      intermediateFrequencyHz: 5e6,
    } as const;
    await checkWaveform(author, { kind: "waveform", tx, fixedPoint: { tx: Q15, rx: Q15 } }, linearFm(tx), {
      complex: false,
      sampleRateHz: 20e6,
    });
  });

  it("NLFM from a Taylor-shaped spectrum", async () => {
    const author = await signedIn(t.app, "author");
    const tx = {
      kind: "nlfm",
      bandwidthHz: 5e6,
      pulseWidthS: 20e-6,
      sampleRateHz: 6.25e6,
      window: { kind: "taylor", nbar: 4, sidelobeDb: -30 },
    } as const;
    await checkWaveform(author, { kind: "waveform", tx, fixedPoint: { tx: Q15, rx: Q15 } }, nonlinearFm(tx), {
      complex: true,
      sampleRateHz: 6.25e6,
    });
  });

  const codes: [string, PhaseCodeSpec, number, boolean][] = [
    ["Barker-13", { kind: "barker", length: 13 }, 13, false],
    ["Frank, order 4", { kind: "frank", order: 4 }, 16, true],
    ["P1, order 4", { kind: "p1", order: 4 }, 16, true],
    ["P2, order 4", { kind: "p2", order: 4 }, 16, true],
    ["P3, 16 chips", { kind: "p3", length: 16 }, 16, true],
    ["P4, 16 chips", { kind: "p4", length: 16 }, 16, true],
  ];
  it.each(codes)("phase code %s, 2 samples per chip", async (_name, code, chips, complex) => {
    const author = await signedIn(t.app, "author");
    const tx = { kind: "phase-code", code, samplesPerChip: 2, sampleRateHz: 5e6 };
    const expected = phaseCode(code, { samplesPerChip: 2 });
    expect(expected.re.length).toBe(2 * chips);
    // A binary code (Barker) is real: every chip is ±1 (Barker 1953; Richards 2014 Table 4.1).
    await checkWaveform(author, { kind: "waveform", tx, fixedPoint: { tx: Q15, rx: Q15 } }, expected, {
      complex,
      sampleRateHz: 5e6,
    });
  });
});

describe("create a filter design from the windowed-sinc designer", () => {
  const cases = [
    ["low-pass 10 MHz at 100 MHz, 5 MHz transition, 70 dB", { band: "lowpass", cutoffHz: 10e6 }],
    [
      "band-pass 20–30 MHz at 100 MHz, 5 MHz transitions, 70 dB",
      { band: "bandpass", lowCutoffHz: 20e6, highCutoffHz: 30e6 },
    ],
  ] as const;
  it.each(cases)("%s", async (_name, band) => {
    const author = await signedIn(t.app, "author");
    const fir = {
      kind: "design",
      sampleRateHz: 100e6,
      transitionHz: 5e6,
      stopbandAttenuationDb: 70,
      ...band,
    } as const;
    const { created, detail } = await create(author, { kind: "filter", fir, fixedPoint: { fir: Q15 } });
    expect(detail.design.kind).toBe("filter");
    expect(detail.tables.map((x) => x.role)).toEqual(["fir"]);
    const expected = designFir(fir).taps;
    // Kaiser's order formula (Kaiser 1974; Oppenheim & Schafer 3rd ed. eq. 7.63):
    // M = ⌈(A − 8) / (2.285 Δω)⌉ with Δω = 2π·5/100 → M = ⌈62 / 0.71785⌉ = 87 (computed by hand), 88 taps.
    expect(detail.tables[0]!.length).toBe(88);
    expect(detail.tables[0]!.complex).toBe(false);
    const v = await tableValues(author, created.revision.id, detail.tables[0]!.id);
    expectSameBits(v.re, expected, "fir.re");
    expect(v.im.every((x) => Object.is(x, 0))).toBe(true);
  });
});

describe("designs in a project", () => {
  it("lists designs with their latest revision and shows one with its revisions", async () => {
    const author = await signedIn(t.app, "author");
    const tx = { kind: "phase-code", code: { kind: "barker", length: 7 }, sampleRateHz: 1e6 };
    const { created } = await create(
      author,
      { kind: "waveform", tx, fixedPoint: { tx: Q15, rx: Q15 } },
      "Barker-7 listing",
    );
    const pid = await projectId(t.app, "coastwatch-s");
    const reviewer = await signedIn(t.app, "reviewer");
    const list = DesignListSchema.parse((await reviewer.get(`/api/projects/${pid}/designs`)).body);
    const mine = list.designs.find((d) => d.id === created.design.id);
    expect(mine).toMatchObject({
      name: "Barker-7 listing",
      kind: "waveform",
      owner: { displayName: "Ilse Marrow" },
    });
    expect(mine!.latestRevision).toMatchObject({ number: 1, state: "draft" });
    const names = list.designs.map((d) => d.name);
    expect(names).toEqual([...names].sort());

    const detail = DesignDetailSchema.parse((await reviewer.get(`/api/designs/${created.design.id}`)).body);
    expect(detail.project.slug).toBe("coastwatch-s");
    expect(detail.revisions.map((r) => r.number)).toEqual([1]);
    expect(detail.canEdit).toBe(false);
  });

  it("refuses a taken name with 409 and the name's path, writing nothing", async () => {
    const author = await signedIn(t.app, "author");
    const content = {
      kind: "filter",
      fir: {
        kind: "design",
        band: "lowpass",
        sampleRateHz: 1e6,
        cutoffHz: 1e5,
        transitionHz: 5e4,
        stopbandAttenuationDb: 50,
      },
      fixedPoint: { fir: Q15 },
    };
    await create(author, content, "Twice");
    const before = await countRows(t.database.pool, "revisions");
    const pid = await projectId(t.app, "coastwatch-s");
    const res = await author.post(`/api/projects/${pid}/designs`).send({ name: "Twice", content });
    const err = expectError(res, 409, "conflict");
    expect(err.details).toEqual([{ path: ["name"], message: "this name is taken in the project" }]);
    expect(await countRows(t.database.pool, "revisions")).toBe(before);
  });

  it("answers bad input with 400 and the zod issue paths; generator refusals point into the content", async () => {
    const author = await signedIn(t.app, "author");
    const pid = await projectId(t.app, "coastwatch-s");
    const before = await countRows(t.database.pool, "designs");
    const missing = await author
      .post(`/api/projects/${pid}/designs`)
      .send({ name: "", content: { kind: "waveform" } });
    const paths = (expectError(missing, 400, "validation_failed").details as { path: unknown[] }[]).map((d) =>
      d.path.join("."),
    );
    expect(paths).toContain("name");
    expect(paths).toContain("content.tx");
    // fs < B for a complex chirp: the DSP core refuses it (Nyquist for a complex signal).
    const tx = { kind: "lfm", bandwidthHz: 10e6, pulseWidthS: 1e-6, sampleRateHz: 5e6 };
    const nyquist = await author
      .post(`/api/projects/${pid}/designs`)
      .send({ name: "Aliased", content: { kind: "waveform", tx, fixedPoint: { tx: Q15, rx: Q15 } } });
    const err = expectError(nyquist, 400, "validation_failed");
    expect(err.details).toEqual([
      { path: ["content", "tx"], message: expect.stringContaining("sampleRateHz") },
    ]);
    expect(await countRows(t.database.pool, "designs")).toBe(before);
  });
});

describe("who may author", () => {
  const content = {
    kind: "waveform",
    tx: { kind: "phase-code", code: { kind: "barker", length: 5 }, sampleRateHz: 1e6 },
    fixedPoint: { tx: Q15, rx: Q15 },
  };

  it.each(["firmware", "reviewer"])("%s gets 403 on create", async (role) => {
    const agent = await signedIn(t.app, role);
    const pid = await projectId(t.app, "coastwatch-s");
    expectError(
      await agent.post(`/api/projects/${pid}/designs`).send({ name: `by ${role}`, content }),
      403,
      "forbidden",
    );
  });

  it("gives 404 to a user outside the project, for the project's designs and for a design's pages", async () => {
    const author = await signedIn(t.app, "author");
    const pid = await projectId(t.app, "harbour-lidar-trials");
    const res = await author.post(`/api/projects/${pid}/designs`).send({ name: "Lidar pulse", content });
    expect(res.status).toBe(201);
    const { design, revision } = CreatedDesignSchema.parse(res.body);
    const firmware = await signedIn(t.app, "firmware"); // not a member of harbour-lidar-trials
    const missing = expectError(await firmware.get(`/api/projects/999999/designs`), 404, "not_found");
    const hidden = expectError(await firmware.get(`/api/projects/${pid}/designs`), 404, "not_found");
    expect(hidden.message).toBe(missing.message);
    expectError(await firmware.get(`/api/designs/${design.id}`), 404, "not_found");
    expectError(await firmware.get(`/api/revisions/${revision.id}`), 404, "not_found");
    expectError(await firmware.get(`/api/revisions/${revision.id}/tables/1/values`), 404, "not_found");
    // The admin sees every project.
    const admin = await signedIn(t.app, "admin");
    expect((await admin.get(`/api/designs/${design.id}`)).status).toBe(200);
  });

  it("needs a session", async () => {
    const pid = await projectId(t.app, "coastwatch-s");
    const { default: request } = await import("supertest");
    expectError(await request(t.app).get(`/api/projects/${pid}/designs`), 401, "unauthenticated");
  });
});

describe("demo designs", () => {
  it("are seeded once into coastwatch-s, owned by the demo author, with their tables", async () => {
    const { seedDemo } = await import("../../server/db/seed");
    const before = await countRows(t.database.pool, "designs");
    await seedDemo(t.database.db); // a second run adds nothing
    expect(await countRows(t.database.pool, "designs")).toBe(before);
    const author = await signedIn(t.app, "author");
    const pid = await projectId(t.app, "coastwatch-s");
    const list = DesignListSchema.parse((await author.get(`/api/projects/${pid}/designs`)).body).designs;
    const byName = new Map(list.map((d) => [d.name, d]));
    // T·fs: 50 µs × 12.5 MHz = 625; 13 chips × 4 samples per chip = 52; 100 µs × 6.25 MHz = 625.
    const expected: [string, string, number][] = [
      ["Long-pulse LFM, 10 MHz / 50 µs, Taylor receive", "tx", 625],
      ["Short pulse Barker-13", "tx", 52],
      ["Low-sidelobe NLFM", "tx", 625],
    ];
    for (const [name, role, length] of expected) {
      const d = byName.get(name);
      expect(d?.owner.displayName, name).toBe("Ilse Marrow");
      const r = RevisionDetailSchema.parse(
        (await author.get(`/api/revisions/${d!.latestRevision!.id}`)).body,
      );
      expect(r.tables.find((x) => x.role === role)?.length, name).toBe(length);
    }
    const fir = byName.get("4:1 decimation FIR");
    expect(fir?.kind).toBe("filter");
  });
});
