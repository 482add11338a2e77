import { describe, expect, it } from "vitest";
import { HomeSchema, ProjectDetailSchema, ProjectSchema } from "../../shared/schemas/projects";
import { expectError, signedIn, useApiTestDatabase } from "./helpers";

const t = useApiTestDatabase();

async function projectIds(): Promise<Record<string, number>> {
  const admin = await t.admin();
  const res = await admin.get("/api/projects");
  return Object.fromEntries((res.body.projects as { slug: string; id: number }[]).map((p) => [p.slug, p.id]));
}

describe("project membership", () => {
  it("shows members only their projects; the admin sees all", async () => {
    const slugs = async (name: string) => {
      const agent = await signedIn(t.app, name);
      const res = await agent.get("/api/projects");
      expect(res.status).toBe(200);
      return ProjectSchema.array()
        .parse(res.body.projects)
        .map((p) => p.slug);
    };
    expect(await slugs("admin")).toEqual(["coastwatch-s", "harbour-lidar-trials"]);
    expect(await slugs("author")).toEqual(["coastwatch-s", "harbour-lidar-trials"]);
    expect(await slugs("reviewer")).toEqual(["coastwatch-s"]);
    expect(await slugs("firmware")).toEqual(["coastwatch-s"]);
  });

  it("answers 404 (not 403) to a non-member asking for a project, and for a missing one", async () => {
    const ids = await projectIds();
    const firmware = await signedIn(t.app, "firmware");
    const hidden = expectError(
      await firmware.get(`/api/projects/${ids["harbour-lidar-trials"]}`),
      404,
      "not_found",
    );
    const missing = expectError(await firmware.get("/api/projects/999999"), 404, "not_found");
    expect(hidden.message).toBe(missing.message);
  });

  it("gives a member the project with its members and their roles", async () => {
    const ids = await projectIds();
    const reviewer = await signedIn(t.app, "reviewer");
    const res = await reviewer.get(`/api/projects/${ids["coastwatch-s"]}`);
    expect(res.status).toBe(200);
    const detail = ProjectDetailSchema.parse(res.body);
    expect(detail.project).toMatchObject({
      slug: "coastwatch-s",
      name: "Coastwatch-S surveillance radar",
      memberCount: 4,
    });
    expect(detail.members.map((m) => m.username).sort()).toEqual(["admin", "author", "firmware", "reviewer"]);
    expect(detail.members.find((m) => m.username === "firmware")?.roles).toEqual(["firmware"]);
  });

  it("lets only an admin create a project and set its members", async () => {
    const author = await signedIn(t.app, "author");
    expectError(
      await author.post("/api/projects").send({ slug: "x-band-trial", name: "X-band trial" }),
      403,
      "forbidden",
    );

    const admin = await t.admin();
    const created = await admin.post("/api/projects").send({ slug: "x-band-trial", name: "X-band trial" });
    expect(created.status).toBe(201);
    const project = ProjectSchema.parse(created.body.project);
    expect(project).toMatchObject({ slug: "x-band-trial", description: "", memberCount: 0 });

    const dup = await admin.post("/api/projects").send({ slug: "x-band-trial", name: "Again" });
    expect(expectError(dup, 400, "validation_failed").details).toEqual([
      { path: ["slug"], message: "this slug is taken" },
    ]);

    // A new user as the only member, so the demo memberships other tests read stay as seeded.
    const made = await admin.post("/api/admin/users").send({
      username: "xband",
      displayName: "Ada Fenn",
      email: "ada.fenn@coastwatch.example",
      roles: ["firmware"],
    });
    const firmwareId = made.body.user.id as number;
    expectError(
      await author.put(`/api/projects/${project.id}/members`).send({ userIds: [firmwareId] }),
      403,
      "forbidden",
    );
    const set = await admin
      .put(`/api/projects/${project.id}/members`)
      .send({ userIds: [firmwareId, firmwareId] });
    expect(set.status).toBe(200);
    expect(ProjectDetailSchema.parse(set.body).members.map((m) => m.username)).toEqual(["xband"]);

    const member = await signedIn(t.app, "xband", made.body.temporaryPassword as string);
    // A temporary password allows nothing but its change.
    const changed = await member
      .post("/api/account/password")
      .send({ currentPassword: made.body.temporaryPassword, newPassword: "xband-chosen-password" });
    expect(changed.status).toBe(204);
    expect((await member.get(`/api/projects/${project.id}`)).status).toBe(200);
    expectError(await author.get(`/api/projects/${project.id}`), 404, "not_found");

    const unknown = await admin.put(`/api/projects/${project.id}/members`).send({ userIds: [999999] });
    expect(expectError(unknown, 400, "validation_failed").details).toEqual([
      { path: ["userIds", 0], message: "no user with id 999999" },
    ]);
    expectError(await admin.put("/api/projects/999999/members").send({ userIds: [] }), 404, "not_found");
  });
});

describe("GET /api/home", () => {
  it("gives a member their projects and count, without admin figures", async () => {
    const firmware = await signedIn(t.app, "firmware");
    const res = await firmware.get("/api/home");
    expect(res.status).toBe(200);
    const home = HomeSchema.parse(res.body);
    expect(home.user.username).toBe("firmware");
    expect(home.projects.map((p) => p.slug)).toEqual(["coastwatch-s"]);
    expect(home.stats).toEqual({ projectCount: 1 });
    expect(home.health).toBeUndefined();
  });

  it("gives the admin user and session counts and the health report", async () => {
    const admin = await t.admin();
    const home = HomeSchema.parse((await admin.get("/api/home")).body);
    const { rows } = await t.database.pool.query<{ users: number; sessions: number }>(
      "select (select count(*)::int from users) as users, (select count(*)::int from session where user_id is not null and expire > now()) as sessions",
    );
    expect(home.stats.userCount).toBe(rows[0]!.users);
    expect(home.stats.activeSessions).toBe(rows[0]!.sessions);
    expect(home.stats.activeSessions).toBeGreaterThanOrEqual(1);
    expect(home.health?.database.ok).toBe(true);
  });
});
