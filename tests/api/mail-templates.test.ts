import { describe, expect, it } from "vitest";
import { MAIL_TEMPLATES } from "../../shared/schemas/mail";
import { DEFAULT_BACKOFF, retryDelaySeconds } from "../../server/mail/backoff";
import { mailTemplates, type MailCommon, type MailData } from "../../server/mail/templates";

const common: MailCommon = {
  appName: "Tapwright",
  link: "http://127.0.0.1:3000/revisions/5",
  project: { name: "Coastwatch S-band", slug: "coastwatch-s" },
  design: { name: 'Chirp <script>alert("x")</script>', kind: "waveform" },
  revision: { number: 2 },
  actor: { displayName: "Ilse Marrow" },
};

const samples: { [K in keyof MailData]: MailData[K] } = {
  submitted: { ...common, note: "" },
  approved: { ...common, comment: "ok" },
  "changes-requested": { ...common, comment: "Use\nW = 14 & F = 13" },
  released: { ...common, release: { version: "1.2.0", notes: "<b>notes</b>" } },
  withdrawn: { ...common, release: { version: "1.2.0" }, reason: "wrong gain" },
  verified: {
    ...common,
    release: { version: "1.2.0" },
    run: {
      vectorSet: "scenario",
      verdict: "fail",
      compared: 83,
      mismatches: 2,
      firstMismatch: "sample 17: expected (12, -3), got (13, -3)",
      simulator: "Icarus <b>12</b>",
      rtlRevision: "",
      uploadSha256: "ab".repeat(32),
      withdrawn: true,
    },
  },
};

describe("mail templates", () => {
  it.each(MAIL_TEMPLATES)("%s renders a one-line subject, a text part and escaped HTML", async (name) => {
    const r = await mailTemplates().render(name, samples[name] as never);
    expect(r.subject).not.toMatch(/[\r\n]/);
    expect(r.subject.startsWith("[coastwatch-s] ")).toBe(true);
    expect(r.text).toContain(common.link);
    expect(r.text.endsWith("\n")).toBe(true);
    expect(r.text).not.toMatch(/\n{3,}/);
    // Names and comments are data, never markup, in the HTML part.
    expect(r.html).not.toContain("<script>");
    expect(r.html).toContain("&lt;script&gt;");
    expect(r.html).toContain(`href="${common.link}"`);
  });

  it("fails on a missing variable instead of sending a blank (strict variables)", async () => {
    const { comment: _omit, ...partial } = samples["changes-requested"];
    await expect(mailTemplates().render("changes-requested", partial as never)).rejects.toThrow(
      /undefined variable: comment/,
    );
  });

  it("keeps the comment's line breaks in the text part and escapes & in the HTML part", async () => {
    const r = await mailTemplates().render("changes-requested", samples["changes-requested"]);
    expect(r.text).toContain("Use\nW = 14 & F = 13");
    expect(r.html).toContain("W = 14 &amp; F = 13");
  });

  it("puts the transmit caution only in waveform releases", async () => {
    const wave = await mailTemplates().render("released", samples.released);
    const fir = await mailTemplates().render("released", {
      ...samples.released,
      design: { name: "FIR", kind: "filter" },
    });
    expect(wave.text).toMatch(/dummy load.*RF-exposure/s);
    expect(wave.html).toContain('role="note"');
    expect(fir.text).not.toContain("dummy load");
    expect(fir.html).not.toContain('role="note"');
  });
});

describe("verified mail", () => {
  it("names the verdict in the subject, the first mismatch and the withdrawal in the body", async () => {
    const r = await mailTemplates().render("verified", samples.verified);
    expect(r.subject).toBe(`[coastwatch-s] Verification FAIL: ${common.design.name} 1.2.0 (scenario)`);
    expect(r.text).toContain("First mismatch: sample 17: expected (12, -3), got (13, -3)");
    expect(r.text).toContain("withdrawn");
    expect(r.text).not.toContain("RTL revision:");
    expect(r.html).toContain("Icarus &lt;b&gt;12&lt;/b&gt;");
    const pass = await mailTemplates().render("verified", {
      ...samples.verified,
      run: { ...samples.verified.run, verdict: "pass", mismatches: 0, firstMismatch: "", withdrawn: false },
    });
    expect(pass.subject).toContain("Verification PASS");
    expect(pass.text).toContain("PASS, bit-exact");
    expect(pass.text).not.toContain("First mismatch");
    expect(pass.text).not.toContain("withdrawn");
  });
});

describe("dispatcher backoff (our policy; doubling delays are common practice)", () => {
  it("doubles from the base, caps at the maximum and stops after the last attempt", () => {
    const delays = [1, 2, 3, 4, 5, 6, 7, 8].map((n) => retryDelaySeconds(n));
    // base·2^(n−1) computed by hand: 30, 60, 120, 240, 480, 960, 1920; attempt 8 is the last.
    expect(delays).toEqual([30, 60, 120, 240, 480, 960, 1920, null]);
    expect(retryDelaySeconds(8, { ...DEFAULT_BACKOFF, maxAttempts: 20 })).toBe(3600);
    expect(() => retryDelaySeconds(0)).toThrow(RangeError);
  });
});
