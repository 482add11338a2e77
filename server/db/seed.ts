import { and, eq, inArray, notInArray } from "drizzle-orm";
import type { Role } from "../../shared/schemas/auth";
import { hashPassword } from "../auth/passwords";
import type { Db } from "./client";
import { projectMembers, projects, userRoles, users } from "./schema";
import { seedDemoDesigns } from "./seed-designs";

/** A demo account: invented people, development only. */
export interface DemoAccount {
  username: string;
  password: string;
  displayName: string;
  email: string;
  roles: Role[];
}

/** The four demo accounts, one per role (README lists them as development-only). */
export const DEMO_ACCOUNTS: readonly DemoAccount[] = [
  {
    username: "admin",
    password: "tapwright-admin",
    displayName: "Noor Vance",
    email: "noor.vance@coastwatch.example",
    roles: ["admin"],
  },
  {
    username: "author",
    password: "tapwright-author",
    displayName: "Ilse Marrow",
    email: "ilse.marrow@coastwatch.example",
    roles: ["author"],
  },
  {
    username: "reviewer",
    password: "tapwright-reviewer",
    displayName: "Tomas Quill",
    email: "tomas.quill@coastwatch.example",
    roles: ["reviewer"],
  },
  {
    username: "firmware",
    password: "tapwright-firmware",
    displayName: "Priya Lund",
    email: "priya.lund@coastwatch.example",
    roles: ["firmware"],
  },
];

/** The demo projects and who belongs to each. */
export const DEMO_PROJECTS = [
  {
    slug: "coastwatch-s",
    name: "Coastwatch-S surveillance radar",
    description:
      "Fictional S-band coastal-surveillance radar: long-pulse LFM for range, a short Barker-13 pulse to fill the blind zone, and a 4:1 decimation filter after the ADC.",
    members: ["admin", "author", "reviewer", "firmware"],
  },
  {
    slug: "harbour-lidar-trials",
    name: "Harbour lidar trials",
    description:
      "Fictional trial of a pulsed lidar for harbour-entrance monitoring; early waveform studies only.",
    members: ["admin", "author"],
  },
] as const;

/** The stored hash for an existing account (kept), or a fresh hash of the demo password. */
async function hashIfMissing(db: Db, a: DemoAccount): Promise<string> {
  const [existing] = await db
    .select({ hash: users.passwordHash })
    .from(users)
    .where(eq(users.username, a.username));
  return existing?.hash ?? hashPassword(a.password);
}

/**
 * Insert or refresh the demo accounts and projects. Idempotent: a second run changes nothing; existing
 * demo accounts are reactivated and get their roles and names back, but keep their current password.
 */
export async function seedDemo(db: Db): Promise<void> {
  const ids = new Map<string, number>();
  for (const a of DEMO_ACCOUNTS) {
    // Existing accounts keep their password: a developer who changed it keeps it, and a warm start
    // spends no bcrypt time (about a second per hash with bcryptjs at cost 12 on a small machine).
    const [row] = await db
      .insert(users)
      .values({
        username: a.username,
        displayName: a.displayName,
        email: a.email,
        passwordHash: await hashIfMissing(db, a),
        mustChangePassword: false,
      })
      .onConflictDoUpdate({
        target: users.username,
        set: { displayName: a.displayName, email: a.email, active: true },
      })
      .returning({ id: users.id });
    if (!row) throw new Error(`could not upsert user ${a.username}`);
    const id = row.id;
    ids.set(a.username, id);
    await db.delete(userRoles).where(and(eq(userRoles.userId, id), notInArray(userRoles.role, a.roles)));
    await db
      .insert(userRoles)
      .values(a.roles.map((role) => ({ userId: id, role })))
      .onConflictDoNothing();
  }

  for (const p of DEMO_PROJECTS) {
    const [row] = await db
      .insert(projects)
      .values({ slug: p.slug, name: p.name, description: p.description })
      .onConflictDoUpdate({ target: projects.slug, set: { name: p.name, description: p.description } })
      .returning({ id: projects.id });
    if (!row) throw new Error(`could not upsert project ${p.slug}`);
    const memberIds = p.members.map((u) => ids.get(u)).filter((v): v is number => v !== undefined);
    // Only demo accounts are managed here; members an admin added by hand stay.
    const demoIds = [...ids.values()];
    const dropped = demoIds.filter((id) => !memberIds.includes(id));
    if (dropped.length > 0) {
      await db
        .delete(projectMembers)
        .where(and(eq(projectMembers.projectId, row.id), inArray(projectMembers.userId, dropped)));
    }
    await db
      .insert(projectMembers)
      .values(memberIds.map((userId) => ({ projectId: row.id, userId })))
      .onConflictDoNothing();
  }
  await seedDemoDesigns(db);
}
