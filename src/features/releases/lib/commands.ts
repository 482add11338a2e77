/** The copyable lines for build scripts on a release page: the repository's puller and a plain curl. */
import type { Release } from "@shared/schemas/releases";

/** Quote for a POSIX shell: single quotes, with embedded ones closed, escaped and reopened. */
export function shellQuote(s: string): string {
  return /^[A-Za-z0-9_./:@=+-]+$/.test(s) ? s : `'${s.replace(/'/g, `'\\''`)}'`;
}

/** `npm run pull -- <project>/<design>@<version> --out DIR --server ORIGIN` (the token comes from TAPWRIGHT_TOKEN). */
export function pullCommand(
  release: Pick<Release, "projectSlug" | "designName" | "version">,
  origin: string,
  out = "DIR",
): string {
  const spec = `${release.projectSlug}/${release.designName}@${release.version}`;
  return `npm run pull -- ${shellQuote(spec)} --out ${shellQuote(out)} --server ${shellQuote(origin)}`;
}

/** `npm run verify -- <project>/<design>@<version> --set scenario FILE --server ORIGIN` (a `verify` token). */
export function verifyCommand(
  release: Pick<Release, "projectSlug" | "designName" | "version">,
  origin: string,
  set = "scenario",
  file = "sim_out.txt",
): string {
  const spec = `${release.projectSlug}/${release.designName}@${release.version}`;
  return `npm run verify -- ${shellQuote(spec)} --set ${shellQuote(set)} ${shellQuote(file)} --server ${shellQuote(origin)}`;
}

/** The bundle's URL by project, design and version (the form build scripts use; ids are not stable across servers). */
export function bundleUrl(
  release: Pick<Release, "projectSlug" | "designName" | "version">,
  origin: string,
): string {
  const path = [
    release.projectSlug,
    "designs",
    release.designName,
    "releases",
    release.version,
    "bundle",
  ].map(encodeURIComponent);
  return `${origin}/api/projects/${path.join("/")}`;
}

/** A curl line that fails on HTTP errors and saves the zip under a predictable name. */
export function curlCommand(
  release: Pick<Release, "projectSlug" | "designName" | "version">,
  origin: string,
): string {
  const file = `${release.projectSlug}-${release.designName}-${release.version}.zip`.replace(
    /[^A-Za-z0-9._-]+/g,
    "-",
  );
  return `curl -fSL -H "Authorization: Bearer $TAPWRIGHT_TOKEN" -o ${shellQuote(file)} ${shellQuote(bundleUrl(release, origin))}`;
}
