// The demo's life cycle (opt-in, `seed-cli.ts` without --no-lifecycle): drives the demo designs through the
// same services the routes call (analysis, submit, decision, release), so the reviewer's queue and the
// firmware engineer's releases have something in them after `npm start`. Every step looks at the current
// state first and does nothing when it is already done, so a warm start adds no revision or release.
import { and, eq } from "drizzle-orm";
import type { Role } from "../../shared/schemas/auth";
import type { RevisionContent, RevisionState } from "../../shared/schemas/designs";
import { env } from "../env";
import { analyseInProcess } from "../services/analyses";
import type { Viewer } from "../services/projects";
import { createRelease } from "../services/releases";
import { decide } from "../services/reviews";
import { createRevision, submitRevision, updateRevision } from "../services/revisions";
import type { Db } from "./client";
import { designs, projects, releases, revisions, userRoles, users } from "./schema";
import { DEMO_DESIGNS } from "./seed-designs";

/** How far a demo revision is taken; a release names its version and notes. */
type Goal =
  | { to: "draft" }
  | { to: "in_review" }
  | { to: "released"; approval: string; version: string; notes: string };

/** One step of the demo plan: a revision number of a named design and where it should end. */
interface PlanStep {
  design: string;
  number: number;
  goal: Goal;
  /** For a revision after r1: the edit that makes it (applied to the previous revision's content). */
  edit?: (content: RevisionContent) => RevisionContent;
}

const [LFM, BARKER, NLFM, FIR] = DEMO_DESIGNS.map((d) => d.name) as [string, string, string, string];

/** The receive word length of the long pulse's r2 (r1 has 16 bits): the change the release diff shows. */
export const DEMO_LFM_R2_RX_BITS = 14;

/** Long-pulse content with its receive table at `bits` (full scale, Q(bits−1)). */
function rxBits(bits: number) {
  return (content: RevisionContent): RevisionContent => {
    if (content.kind !== "waveform") return content;
    const rx = content.fixedPoint.rx;
    return {
      ...content,
      fixedPoint: { ...content.fixedPoint, rx: { ...rx, wordLength: bits, fractionLength: bits - 1 } },
    };
  };
}

/** The demo plan, in order (r2 of the long pulse after its r1 is released). Invented programme wording. */
export const DEMO_LIFECYCLE_PLAN: readonly PlanStep[] = [
  {
    design: LFM,
    number: 1,
    goal: {
      to: "released",
      approval:
        "PSL and ISLR meet the programme limits with margin; mismatch loss within budget. Approved for the range-gate build.",
      version: "1.0.0",
      notes:
        "First issue for the Coastwatch-S receiver build: 16-bit transmit and receive tables, full-scale scaling.",
    },
  },
  {
    design: LFM,
    number: 2,
    edit: rxBits(DEMO_LFM_R2_RX_BITS),
    goal: {
      to: "released",
      approval:
        "Receive table at 14 bits still meets every limit; the coefficient SQNR drop is expected and within margin.",
      version: "1.1.0",
      notes:
        "Receive table narrowed from 16 to 14 bits to fit the pulse-compression multipliers; transmit table unchanged.",
    },
  },
  {
    design: FIR,
    number: 1,
    goal: {
      to: "released",
      approval: "Stopband and passband ripple meet the limits at 18 bits.",
      version: "1.0.0",
      notes: "First issue of the anti-alias filter ahead of the 4:1 decimator.",
    },
  },
  { design: BARKER, number: 1, goal: { to: "in_review" } },
  { design: NLFM, number: 1, goal: { to: "draft" } },
];

/** A demo account as a viewer with its current roles, or null when it is missing. */
async function viewerOf(db: Db, username: string): Promise<Viewer | null> {
  const [u] = await db.select({ id: users.id }).from(users).where(eq(users.username, username));
  if (!u) return null;
  const roles = await db.select({ role: userRoles.role }).from(userRoles).where(eq(userRoles.userId, u.id));
  return { id: u.id, roles: roles.map((r) => r.role as Role) };
}

async function revisionOf(db: Db, designId: number, number: number) {
  const [row] = await db
    .select({ id: revisions.id, state: revisions.state, content: revisions.content })
    .from(revisions)
    .where(and(eq(revisions.designId, designId), eq(revisions.number, number)));
  return row;
}

const ORDER: readonly RevisionState[] = ["draft", "in_review", "approved", "released"];

/** Create revision `number` from the previous one once that one is released (never a later one). */
async function ensureRevision(db: Db, author: Viewer, designId: number, step: PlanStep) {
  const existing = await revisionOf(db, designId, step.number);
  if (existing) return existing;
  const previous = await revisionOf(db, designId, step.number - 1);
  // Only after the previous revision is released (createRevision copies the newest): otherwise leave it alone.
  if (!previous || previous.state !== "released") return undefined;
  await createRevision(db, author, designId);
  return revisionOf(db, designId, step.number);
}

/** Take one revision as far as its goal, skipping what is done; a state off the demo path is left alone. */
async function advance(
  db: Db,
  cast: { author: Viewer; reviewer: Viewer },
  designId: number,
  step: PlanStep,
  softwareVersion: string,
) {
  let rev = await ensureRevision(db, cast.author, designId, step);
  if (!rev || !ORDER.includes(rev.state)) return;
  const id = rev.id;
  if (rev.state === "draft") {
    if (step.edit) {
      const wanted = step.edit(rev.content as RevisionContent);
      // Re-applying the edit is skipped when the draft already has it (a start that stopped half-way).
      if (JSON.stringify(wanted) !== JSON.stringify(rev.content))
        await updateRevision(db, cast.author, id, wanted);
    }
    await analyseInProcess(db, id, softwareVersion);
    if (step.goal.to === "draft") return;
    await submitRevision(db, cast.author, id);
  }
  const goal = step.goal;
  if (goal.to !== "released") return;
  rev = await revisionOf(db, designId, step.number);
  if (rev?.state === "in_review")
    await decide(db, cast.reviewer, id, { decision: "approved", comment: goal.approval });
  rev = await revisionOf(db, designId, step.number);
  if (rev?.state !== "approved") return;
  const [used] = await db
    .select({ id: releases.id })
    .from(releases)
    .where(and(eq(releases.designId, designId), eq(releases.version, goal.version)));
  if (!used) await createRelease(db, cast.author, id, { version: goal.version, notes: goal.notes });
}

/**
 * Advance the demo designs of coastwatch-s through analysis, review and release as DEMO_LIFECYCLE_PLAN says.
 * Idempotent; does nothing when the demo project, accounts or designs are missing.
 */
export async function seedDemoLifecycle(db: Db, softwareVersion = env().TAPWRIGHT_VERSION): Promise<void> {
  const [project] = await db
    .select({ id: projects.id })
    .from(projects)
    .where(eq(projects.slug, "coastwatch-s"));
  const author = await viewerOf(db, "author");
  const reviewer = await viewerOf(db, "reviewer");
  if (!project || !author || !reviewer) return;
  for (const step of DEMO_LIFECYCLE_PLAN) {
    const [design] = await db
      .select({ id: designs.id })
      .from(designs)
      .where(and(eq(designs.projectId, project.id), eq(designs.name, step.design)));
    if (design) await advance(db, { author, reviewer }, design.id, step, softwareVersion);
  }
}
