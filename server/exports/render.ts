/**
 * Rendering one table with one export template into file bytes (UTF-8 text or the binary layout);
 * the bundle builder calls this once per table and selected template.
 */
import { createHash } from "node:crypto";
import { renderBinary } from "../../shared/exports/binary";
import type { ExportContext } from "../../shared/exports/context";
import { renderTemplate } from "./engine";

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
    bytes = new TextEncoder().encode(await renderTemplate(template.body, ctx));
  }
  return {
    fileName: exportFileName(ctx, template),
    bytes,
    sha256: createHash("sha256").update(bytes).digest("hex"),
    template: { id: template.id, name: template.name, version: template.version },
  };
}
