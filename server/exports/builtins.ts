/**
 * The built-in export templates: Liquid files in templates/export/ with a small front matter
 * (id, name, version, extension, description between `---` lines), plus the raw binary renderer.
 */
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

/** templates/export/, independent of the working directory. */
export const EXPORT_TEMPLATE_DIR = fileURLToPath(new URL("../../templates/export", import.meta.url));

/** A built-in template as the API and the bundle builder see it. */
export interface BuiltinTemplate {
  id: string;
  name: string;
  version: number;
  extension: string;
  description: string;
  /** "text": a Liquid body; "binary": the built-in little-endian renderer (no body). */
  kind: "text" | "binary";
  body: string | null;
}

/** The binary export is code, not a template (Liquid renders text). */
export const BINARY_TEMPLATE: BuiltinTemplate = {
  id: "binary",
  name: "Raw little-endian binary",
  version: 1,
  extension: "bin",
  description:
    "Each word in the smallest of int8/int16/int32 (uint… when unsigned) that holds W, little-endian; complex tables I then Q per tap.",
  kind: "binary",
  body: null,
};

const FRONT_MATTER = /^---\r?\n([\s\S]*?)\r?\n---\r?\n/;

/** Splits `---` front matter (key: value lines) from a template file; throws naming the file when a field is missing. */
export function parseFrontMatter(file: string, text: string): Omit<BuiltinTemplate, "kind"> {
  const m = FRONT_MATTER.exec(text);
  if (!m) throw new Error(`${file}: no front matter`);
  const fields = new Map<string, string>();
  for (const line of (m[1] ?? "").split(/\r?\n/)) {
    const at = line.indexOf(":");
    if (at > 0) fields.set(line.slice(0, at).trim(), line.slice(at + 1).trim());
  }
  const need = (k: string) => {
    const v = fields.get(k);
    if (!v) throw new Error(`${file}: front matter lacks "${k}"`);
    return v;
  };
  const version = Number(need("version"));
  if (!Number.isInteger(version) || version < 1)
    throw new Error(`${file}: version must be a positive integer`);
  return {
    id: need("id"),
    name: need("name"),
    version,
    extension: need("extension"),
    description: need("description"),
    body: text.slice(m[0].length),
  };
}

let cached: BuiltinTemplate[] | undefined;

/** Every built-in template, text ones sorted by file name, then the binary renderer. Read once per process. */
export function builtinTemplates(dir = EXPORT_TEMPLATE_DIR): BuiltinTemplate[] {
  if (dir === EXPORT_TEMPLATE_DIR && cached) return cached;
  const files = readdirSync(dir)
    .filter((f) => f.endsWith(".liquid"))
    .sort();
  const list: BuiltinTemplate[] = files.map((f) => ({
    ...parseFrontMatter(f, readFileSync(path.join(dir, f), "utf8")),
    kind: "text" as const,
  }));
  list.push(BINARY_TEMPLATE);
  if (dir === EXPORT_TEMPLATE_DIR) cached = list;
  return list;
}

/** One built-in by id, or undefined. */
export function builtinTemplate(id: string): BuiltinTemplate | undefined {
  return builtinTemplates().find((t) => t.id === id);
}
