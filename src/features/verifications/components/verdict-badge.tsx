import type { ReleaseVerification } from "@shared/schemas/releases";
import { Badge } from "@/components/ui/badge";

/** PASS / FAIL of one run. */
export function VerdictBadge({ verdict }: { verdict: "pass" | "fail" }) {
  return <Badge tone={verdict === "pass" ? "pass" : "fail"}>{verdict === "pass" ? "PASS" : "FAIL"}</Badge>;
}

/** A release's verification state for list cells: the newest verdict and how many sets have passed. */
export function VerificationCell({ verification }: { verification: ReleaseVerification }) {
  const { latest, passedSets, sets } = verification;
  if (!latest)
    return (
      <span className="text-xs text-ink-600" title="No verification run recorded">
        not run
      </span>
    );
  const passed = sets.filter((s) => passedSets.includes(s)).length;
  return (
    <span
      className="inline-flex items-center gap-1.5 whitespace-nowrap"
      title={`Newest run: ${latest.verdict} on ${latest.vectorSet}; ${passed} of ${sets.length} vector sets have a passing run`}
    >
      <VerdictBadge verdict={latest.verdict} />
      <span className="font-mono text-xs text-ink-700">
        {passed}/{sets.length} passed
      </span>
    </span>
  );
}
