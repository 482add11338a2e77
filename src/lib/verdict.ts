import type { Verdict } from "@shared/report-words";

/** The badge colour of a verdict: not judged is amber, never the green of a pass. */
export const VERDICT_TONE: Readonly<Record<Verdict, "pass" | "fail" | "warn">> = {
  pass: "pass",
  fail: "fail",
  "not-judged": "warn",
};
