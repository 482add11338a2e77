import type { RevisionState } from "@shared/schemas/designs";

/** A revision state as people say it, with the badge tone it is shown in. */
export const REVISION_STATE_VIEW: Record<
  RevisionState,
  { label: string; tone: "neutral" | "signal" | "copper" | "pass" | "warn" | "fail" }
> = {
  draft: { label: "Draft", tone: "neutral" },
  in_review: { label: "In review", tone: "signal" },
  approved: { label: "Approved", tone: "pass" },
  changes_requested: { label: "Changes requested", tone: "warn" },
  released: { label: "Released", tone: "copper" },
};
