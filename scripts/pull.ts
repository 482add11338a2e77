/**
 * npm run pull -- <project>/<design>@<version|latest> --out DIR [--server URL]
 *
 * Downloads a release bundle from Tapwright, verifies it and unpacks it. The token comes from the
 * TAPWRIGHT_TOKEN environment variable (never a command-line argument, which would land in shell history
 * and process lists); the server from --server or TAPWRIGHT_URL (default http://127.0.0.1:3000).
 * Checks, in order, before anything is written: the zip's SHA-256 equals the release's recorded one;
 * SHA256SUMS lists every other file exactly once and each digest matches; manifest.json agrees on sizes
 * and digests. Exit codes: 0 done, 1 verification failed, 2 usage, 3 server or network error.
 */
import JSZip from "jszip";
import { createHash } from "node:crypto";
import { existsSync, mkdirSync, readdirSync, writeFileSync } from "node:fs";
import path from "node:path";

class Failure extends Error {
  constructor(
    message: string,
    readonly exitCode: number,
  ) {
    super(message);
  }
}

const USAGE = "usage: npm run pull -- <project>/<design>@<version|latest> --out DIR [--server URL]";
const sha256 = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");

/** The parsed command line. */
interface Args {
  project: string;
  design: string;
  version: string;
  out: string;
  server: string;
}

function parseArgs(argv: string[], env: NodeJS.ProcessEnv): Args {
  let spec: string | undefined;
  let out: string | undefined;
  let server = env.TAPWRIGHT_URL ?? "http://127.0.0.1:3000";
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i]!;
    if (a === "--out") out = argv[++i];
    else if (a === "--server") server = argv[++i] ?? "";
    else if (a === "--help" || a === "-h") throw new Failure(USAGE, 0);
    else if (!a.startsWith("--") && spec === undefined) spec = a;
    else throw new Failure(`unknown argument ${a}\n${USAGE}`, 2);
  }
  // Split at the first "/" and the last "@": design names may contain either.
  const m = spec ? /^([^/]+)\/(.+)@([^@]+)$/.exec(spec) : null;
  if (!m || !out) throw new Failure(USAGE, 2);
  if (!/^https?:\/\//.test(server)) throw new Failure(`--server must be an http(s) URL, got ${server}`, 2);
  return { project: m[1]!, design: m[2]!, version: m[3]!, out, server: server.replace(/\/+$/, "") };
}

async function get(url: string, token: string | undefined): Promise<Response> {
  let res: Response;
  try {
    res = await fetch(url, { headers: token ? { Authorization: `Bearer ${token}` } : {} });
  } catch (err) {
    throw new Failure(`cannot reach ${url}: ${(err as Error).message}`, 3);
  }
  if (!res.ok) {
    let message = res.statusText;
    try {
      const body = (await res.json()) as { error?: { code?: string; message?: string } };
      message = `${body.error?.code ?? res.status}: ${body.error?.message ?? message}`;
    } catch {
      // not JSON: keep the status text
    }
    throw new Failure(`${url} answered ${res.status} (${message})`, res.status === 500 ? 1 : 3);
  }
  return res;
}

/** A safe relative path inside the output folder, or a Failure. */
function safePath(p: string): string {
  if (!/^[A-Za-z0-9._-]+(\/[A-Za-z0-9._-]+)*$/.test(p) || p.split("/").some((s) => s === "." || s === ".."))
    throw new Failure(`refusing a suspicious path in the bundle: ${JSON.stringify(p)}`, 1);
  return p;
}

/** Verify a bundle's bytes completely; returns its files by path. */
async function verifyBundle(zipBytes: Uint8Array, expectedSha256: string): Promise<Map<string, Uint8Array>> {
  const actual = sha256(zipBytes);
  if (actual !== expectedSha256)
    throw new Failure(`bundle SHA-256 ${actual} differs from the release's recorded ${expectedSha256}`, 1);
  const zip = await JSZip.loadAsync(zipBytes);
  const files = new Map<string, Uint8Array>();
  for (const entry of Object.values(zip.files)) {
    if (entry.dir) continue;
    files.set(safePath(entry.name), await entry.async("uint8array"));
  }
  const sums = files.get("SHA256SUMS");
  if (!sums) throw new Failure("the bundle has no SHA256SUMS", 1);
  const listed = new Set<string>();
  for (const line of new TextDecoder().decode(sums).split("\n")) {
    if (line === "") continue;
    const m = /^([0-9a-f]{64}) {2}(.+)$/.exec(line);
    if (!m) throw new Failure(`SHA256SUMS: malformed line ${JSON.stringify(line)}`, 1);
    const [, digest, p] = m as unknown as [string, string, string];
    const bytes = files.get(p);
    if (!bytes) throw new Failure(`SHA256SUMS lists ${p}, which is not in the bundle`, 1);
    if (sha256(bytes) !== digest) throw new Failure(`${p}: checksum mismatch`, 1);
    if (listed.has(p)) throw new Failure(`SHA256SUMS lists ${p} twice`, 1);
    listed.add(p);
  }
  for (const p of files.keys())
    if (p !== "SHA256SUMS" && !listed.has(p))
      throw new Failure(`${p} is in the bundle but not in SHA256SUMS`, 1);
  const manifestBytes = files.get("manifest.json");
  if (!manifestBytes) throw new Failure("the bundle has no manifest.json", 1);
  const manifest = JSON.parse(new TextDecoder().decode(manifestBytes)) as {
    schema?: string;
    files?: { path: string; size: number; sha256: string }[];
  };
  if (manifest.schema !== "tapwright-bundle")
    throw new Failure("manifest.json is not a tapwright-bundle manifest", 1);
  for (const f of manifest.files ?? []) {
    const bytes = files.get(f.path);
    if (!bytes || bytes.byteLength !== f.size || sha256(bytes) !== f.sha256)
      throw new Failure(`manifest.json disagrees with ${f.path}`, 1);
  }
  return files;
}

async function main(): Promise<void> {
  const args = parseArgs(process.argv.slice(2), process.env);
  const token = process.env.TAPWRIGHT_TOKEN || undefined;
  const base = `${args.server}/api/projects/${encodeURIComponent(args.project)}/designs/${encodeURIComponent(args.design)}/releases/${encodeURIComponent(args.version)}`;
  const { release } = (await (await get(base, token)).json()) as {
    release: {
      id: number;
      version: string;
      bundleSha256: string | null;
      withdrawn: { reason: string } | null;
    };
  };
  if (!release.bundleSha256) throw new Failure(`release ${release.version} has no bundle`, 1);
  // By id, not by "latest" again: a release made in between must not change what we verify against.
  const zipBytes = new Uint8Array(
    await (await get(`${args.server}/api/releases/${release.id}/bundle`, token)).arrayBuffer(),
  );
  const files = await verifyBundle(zipBytes, release.bundleSha256);
  const out = path.resolve(args.out);
  if (existsSync(out) && readdirSync(out).length > 0)
    throw new Failure(`${args.out} is not empty; choose an empty or new folder`, 2);
  for (const [p, bytes] of [...files].sort(([a], [b]) => (a < b ? -1 : 1))) {
    const target = path.join(out, ...p.split("/"));
    mkdirSync(path.dirname(target), { recursive: true });
    writeFileSync(target, bytes);
  }
  if (release.withdrawn)
    process.stderr.write(`WARNING: ${release.version} is WITHDRAWN: ${release.withdrawn.reason}\n`);
  process.stdout.write(
    `${args.project}/${args.design} ${release.version}: ${files.size} files verified (bundle sha256 ${release.bundleSha256}) into ${args.out}\n`,
  );
}

main().catch((err: unknown) => {
  if (err instanceof Failure) {
    (err.exitCode === 0 ? process.stdout : process.stderr).write(`${err.message}\n`);
    process.exit(err.exitCode);
  }
  process.stderr.write(`pull: ${(err as Error).stack ?? String(err)}\n`);
  process.exit(3);
});
