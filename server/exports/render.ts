/**
 * Rendering one table with one export template into file bytes (UTF-8 text or the binary layout);
 * the bundle builder calls this once per table and selected template.
 */
import { createHash } from "node:crypto";
import { renderBinary } from "../../shared/exports/binary";
import type { ExportContext } from "../../shared/exports/context";
import { sampleExportContext } from "../../shared/exports/sample";
import type { SampleKind } from "../../shared/exports/sample-kinds";
import { PREVIEW_TEXT_MAX, type PreviewResult } from "../../shared/exports/schemas";
import { renderTemplate, TEMPLATE_LIMITS, TemplateError } from "./engine";

/** What renderExport needs of a template (a built-in or a stored custom one). */
export interface RenderableTemplate {
  id: string;
  name: string;
  version: number;
  extension: string;
  kind: "text" | "binary";
  body: string | null;
}

/** A rendered file, with the facts a manifest lists. */
export interface RenderedExport {
  fileName: string;
  bytes: Uint8Array;
  sha256: string;
  template: { id: string; name: string; version: number };
}

/** Suggested file name: `<table ident>.<template id>.<extension>` (unique per table and template). */
export function exportFileName(
  ctx: ExportContext,
  template: Pick<RenderableTemplate, "id" | "extension">,
): string {
  const safeId = template.id.replace(/[^A-Za-z0-9_-]+/g, "-");
  // `x_rx.csv`, not `x_rx.csv.csv`: the template id is only added when the extension does not already say it.
  if (safeId === template.extension) return `${ctx.table.ident}.${template.extension}`;
  return `${ctx.table.ident}.${safeId}.${template.extension}`;
}

/** Renders one table with one template; a bad template throws TemplateError (line and column). */
export async function renderExport(
  template: RenderableTemplate,
  ctx: ExportContext,
): Promise<RenderedExport> {
  let bytes: Uint8Array;
  if (template.kind === "binary") bytes = renderBinary(ctx);
  else {
    if (template.body === null) throw new Error(`template ${template.id} has no body`);
    // No wall-time limit for a real table (it renders in a CPU thread): output size and loop work bound it.
    bytes = new TextEncoder().encode(
      await renderTemplate(template.body, ctx, { renderMs: Number.POSITIVE_INFINITY, sync: true }),
    );
  }
  return {
    fileName: exportFileName(ctx, template),
    bytes,
    sha256: createHash("sha256").update(bytes).digest("hex"),
    template: { id: template.id, name: template.name, version: template.version },
  };
}

/** Renders a body on a sample table; the answer carries the text or the problem with line and column. */
export async function renderPreview(body: string, sample: SampleKind): Promise<PreviewResult> {
  try {
    const text = await renderTemplate(body, sampleExportContext(sample), {
      renderMs: TEMPLATE_LIMITS.previewMs,
    });
    const bytes = Buffer.byteLength(text, "utf8");
    return text.length > PREVIEW_TEXT_MAX
      ? { ok: true, text: text.slice(0, PREVIEW_TEXT_MAX), truncated: true, bytes }
      : { ok: true, text, truncated: false, bytes };
  } catch (err) {
    if (err instanceof TemplateError)
      return { ok: false, error: { message: err.message, line: err.line, column: err.column } };
    throw err;
  }
}
