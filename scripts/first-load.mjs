// First-load JavaScript of the built client (run `npx vite build` first): the entry chunk and, per route, the
// entry plus every chunk that route's page imports statically — what a browser fetches before that page
// paints. Sizes raw and gzip (level 9, node:zlib). Node built-ins only. Usage: node scripts/first-load.mjs [outDir]
import { readFileSync, readdirSync } from "node:fs";
import { gzipSync } from "node:zlib";

const dir = `${process.argv[2] ?? "dist/client"}/assets/`;
const files = readdirSync(dir);
const deps = (f) =>
  new Set(
    [...readFileSync(dir + f, "utf8").matchAll(/(?:from|import)\s*"\.\/([^"]+\.js)"/g)].map((m) => m[1]),
  );
function closure(start, into = new Set()) {
  const stack = [start];
  while (stack.length) {
    const f = stack.pop();
    if (into.has(f)) continue;
    into.add(f);
    for (const d of deps(f)) stack.push(d);
  }
  return into;
}
const size = (set) =>
  [...set].reduce(
    ([raw, gz], f) => {
      const b = readFileSync(dir + f);
      return [raw + b.length, gz + gzipSync(b, { level: 9 }).length];
    },
    [0, 0],
  );
const kb = ([raw, gz]) => `${(raw / 1000).toFixed(1)} kB, ${(gz / 1000).toFixed(1)} kB gzip`;
const entry = files.find((f) => /^index-.*\.js$/.test(f));
const base = closure(entry);
console.log(`entry (${entry}): ${kb(size(base))}`);
const ROUTES = {
  "/sign-in": "sign-in",
  "/ (home)": "home",
  "/projects": "projects-page",
  "/projects/:id": "project-page",
  "/projects/:id/designs/new": "new-design-page",
  "/revisions/:id": "revision-page",
  "/revisions/:id/report": "report-page",
  "/releases/:id": "release-page",
  "/templates/:id": "template-editor-page",
};
for (const [route, name] of Object.entries(ROUTES)) {
  const f = files.find((x) => x.startsWith(`${name}-`) && x.endsWith(".js"));
  if (!f) continue;
  console.log(`${route}: ${kb(size(closure(f, new Set(base))))}`);
}
