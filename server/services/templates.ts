/**
 * Export templates: built-ins (files) and custom ones (rows). Every save parses the body and
 * test-renders it on both sample tables, so a stored template is known to render; each change of a
 * custom template bumps its version and keeps the saved body in export_template_versions.
 */
import { asc, eq, sql } from "drizzle-orm";
import type { z } from "zod";
import type { SampleKind } from "../../shared/exports/sample-kinds";
import {
  type CreateTemplateSchema,
  type PreviewResult,
  type TemplateDetail,
  type TemplateSummary,
  type UpdateTemplateSchema,
} from "../../shared/exports/schemas";
import type { Db } from "../db/client";
import { exportTemplates, exportTemplateVersions, users } from "../db/schema";
import { builtinTemplate, builtinTemplates, type BuiltinTemplate } from "../exports/builtins";
import type { RenderableTemplate } from "../exports/render";
import { HttpError } from "../http/errors";
import { cpuPool } from "../jobs/cpu-pool";
import { recordAudit } from "./audit";

function builtinSummary(t: BuiltinTemplate): TemplateDetail {
  return {
    id: t.id,
    builtin: true,
    kind: t.kind,
    name: t.name,
    description: t.description,
    extension: t.extension,
    version: t.version,
    updatedAt: null,
    updatedBy: null,
    body: t.body,
  };
}

const customSelection = {
  id: exportTemplates.id,
  name: exportTemplates.name,
  description: exportTemplates.description,
  extension: exportTemplates.extension,
  version: exportTemplates.version,
  body: exportTemplates.body,
  updatedAt: exportTemplates.updatedAt,
  updatedBy: users.displayName,
};

type CustomRow = { id: number; updatedAt: Date; body: string } & Omit<
  TemplateDetail,
  "id" | "updatedAt" | "builtin" | "kind" | "body"
>;

function customDetail(r: CustomRow): TemplateDetail {
  return { ...r, id: String(r.id), builtin: false, kind: "text", updatedAt: r.updatedAt.toISOString() };
}

async function customRows(db: Db, id?: number): Promise<CustomRow[]> {
  const q = db
    .select(customSelection)
    .from(exportTemplates)
    .innerJoin(users, eq(users.id, exportTemplates.updatedById))
    .orderBy(asc(exportTemplates.name));
  return id === undefined ? q : q.where(eq(exportTemplates.id, id));
}

/** Built-ins first (file order), then custom templates by name; no bodies. */
export async function listTemplates(db: Db): Promise<TemplateSummary[]> {
  const strip = ({ body: _body, ...rest }: TemplateDetail): TemplateSummary => rest;
  return [...builtinTemplates().map(builtinSummary), ...(await customRows(db)).map(customDetail)].map(strip);
}

/** One template by id: a built-in's word id or a custom template's number; 404 otherwise. */
export async function getTemplate(db: Db, id: string): Promise<TemplateDetail> {
  if (/^\d+$/.test(id)) {
    const [row] = await customRows(db, Number(id));
    if (row) return customDetail(row);
  } else {
    const b = builtinTemplate(id);
    if (b) return builtinSummary(b);
  }
  throw new HttpError("not_found", `No export template "${id}"`);
}

/** What the bundle builder renders with: templates by id, each with the version it will name in the manifest. */
export async function renderableTemplates(db: Db, ids: readonly string[]): Promise<RenderableTemplate[]> {
  const out: RenderableTemplate[] = [];
  for (const id of ids) {
    const t = await getTemplate(db, id);
    out.push({
      id: t.id,
      name: t.name,
      version: t.version,
      extension: t.extension,
      kind: t.kind,
      body: t.body,
    });
  }
  return out;
}

/** Renders a body on a sample table in a CPU thread (server/exports/render.ts renderPreview); text or the problem. */
export function previewTemplate(body: string, sample: SampleKind): Promise<PreviewResult> {
  return cpuPool().run("previewTemplate", { body, sample });
}

/** Parses and test-renders a body on both sample tables; a problem is a 400 naming `body` with line and column. */
export async function validateTemplateBody(body: string): Promise<void> {
  for (const sample of ["complex", "real"] as const) {
    const result = await previewTemplate(body, sample);
    if (!result.ok) {
      const { message, line, column } = result.error;
      const where = line === null ? "" : `line ${line}, column ${column ?? 1}: `;
      throw new HttpError(
        "validation_failed",
        `The template does not render on the ${sample} sample table: ${where}${message}`,
        [{ path: ["body"], message: `${where}${message}`, line, column, sample }],
      );
    }
  }
}

function nameIsBuiltin(name: string): boolean {
  return builtinTemplates().some((b) => b.name.toLowerCase() === name.toLowerCase());
}

type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

/** True when another custom template has this name, ignoring case. */
async function nameClash(tx: Tx, name: string, exceptId: number | null): Promise<boolean> {
  const same = sql`lower(${exportTemplates.name}) = lower(${name})`;
  const [clash] = await tx
    .select({ id: exportTemplates.id })
    .from(exportTemplates)
    .where(exceptId === null ? same : sql`${same} and ${exportTemplates.id} <> ${exceptId}`);
  return clash !== undefined;
}

const nameTaken = (name: string) =>
  new HttpError("conflict", `A template named "${name}" already exists`, [
    { path: ["name"], message: "this name is taken" },
  ]);

/** Creates a custom template at version 1 (admin; checked by the route). */
export async function createTemplate(
  db: Db,
  userId: number,
  input: z.infer<typeof CreateTemplateSchema>,
): Promise<TemplateDetail> {
  if (nameIsBuiltin(input.name)) throw nameTaken(input.name);
  await validateTemplateBody(input.body);
  const id = await db.transaction(async (tx) => {
    // Names differing only in case would look the same in a bundle's manifest.
    if (await nameClash(tx, input.name, null)) throw nameTaken(input.name);
    const [row] = await tx
      .insert(exportTemplates)
      .values({ ...input, version: 1, createdById: userId, updatedById: userId })
      .onConflictDoNothing({ target: exportTemplates.name })
      .returning({ id: exportTemplates.id });
    if (!row) throw nameTaken(input.name);
    await tx.insert(exportTemplateVersions).values({
      templateId: row.id,
      version: 1,
      name: input.name,
      extension: input.extension,
      body: input.body,
      savedById: userId,
    });
    await recordAudit(tx, {
      action: "template.create",
      subjectType: "export-template",
      subjectId: row.id,
      summary: `Created export template "${input.name}" (v1)`,
      details: { name: input.name, extension: input.extension, version: 1 },
    });
    return row.id;
  });
  return getTemplate(db, String(id));
}

/** Changes a custom template: +1 version on every save; 409 when `version` is stale; built-ins are read-only. */
export async function updateTemplate(
  db: Db,
  userId: number,
  id: string,
  input: z.infer<typeof UpdateTemplateSchema>,
): Promise<TemplateDetail> {
  if (!/^\d+$/.test(id)) {
    if (builtinTemplate(id))
      throw new HttpError("forbidden", "Built-in templates cannot be changed; create a custom one");
    throw new HttpError("not_found", `No export template "${id}"`);
  }
  const templateId = Number(id);
  if (input.name !== undefined && nameIsBuiltin(input.name)) throw nameTaken(input.name);
  if (input.body !== undefined) await validateTemplateBody(input.body);
  await db.transaction(async (tx) => {
    // Row lock: two concurrent saves get versions n+1 and n+2, never the same number twice.
    const [current] = await tx
      .select()
      .from(exportTemplates)
      .where(eq(exportTemplates.id, templateId))
      .for("update");
    if (!current) throw new HttpError("not_found", `No export template "${id}"`);
    if (input.version !== undefined && input.version !== current.version)
      throw new HttpError(
        "conflict",
        `The template changed meanwhile (now v${current.version}, you edited v${input.version}); reload and apply your change again`,
      );
    const next = {
      name: input.name ?? current.name,
      description: input.description ?? current.description,
      extension: input.extension ?? current.extension,
      body: input.body ?? current.body,
    };
    if (next.name !== current.name && (await nameClash(tx, next.name, templateId)))
      throw nameTaken(next.name);
    const unchanged =
      next.name === current.name &&
      next.description === current.description &&
      next.extension === current.extension &&
      next.body === current.body;
    if (unchanged) return;
    const version = current.version + 1;
    await tx
      .update(exportTemplates)
      .set({ ...next, version, updatedById: userId, updatedAt: new Date() })
      .where(eq(exportTemplates.id, templateId));
    await tx.insert(exportTemplateVersions).values({
      templateId,
      version,
      name: next.name,
      extension: next.extension,
      body: next.body,
      savedById: userId,
    });
    const changed = (["name", "description", "extension", "body"] as const).filter(
      (k) => next[k] !== current[k],
    );
    await recordAudit(tx, {
      action: "template.update",
      subjectType: "export-template",
      subjectId: templateId,
      summary: `Changed export template "${next.name}" to v${version} (${changed.join(", ")})`,
      details: { version, changed },
    });
  });
  return getTemplate(db, id);
}
