/**
 * npm run verify -- <project>/<design>@<version|latest> --set NAME FILE [--latency N] [--format auto|text|hex]
 *                   [--simulator TEXT] [--rtl-revision TEXT] [--server URL]
 *
 * Uploads a simulation output to Tapwright as a verification run of one vector set of a release and prints
 * the verdict. The token comes from TAPWRIGHT_TOKEN (scope `verify`, or `read-write`), never the command
 * line; the server from --server or TAPWRIGHT_URL (default http://127.0.0.1:3000). Exit codes: 0 pass,
 * 1 fail (not bit-exact), 2 usage or a file the server refused (its message names line and column),
 * 3 server or network error, 4 release or vector set not found. docs/verification.md has the details.
 */
import { readFileSync } from "node:fs";
import path from "node:path";

class Failure extends Error {
  constructor(
    message: string,
    readonly exitCode: number,
  ) {
    super(message);
  }
}

const USAGE =
  "usage: npm run verify -- <project>/<design>@<version|latest> --set NAME FILE [--latency N] [--format auto|text|hex] [--simulator TEXT] [--rtl-revision TEXT] [--server URL]";

interface Args {
  project: string;
  design: string;
  version: string;
  set: string;
  file: string;
  server: string;
  fields: Record<string, string>;
}

function parseArgs(argv: string[], env: NodeJS.ProcessEnv): Args {
  let spec: string | undefined;
  let file: string | undefined;
  let set: string | undefined;
  let server = env.TAPWRIGHT_URL ?? "http://127.0.0.1:3000";
  const fields: Record<string, string> = {};
  const value = (i: number, flag: string) => {
    const v = argv[i];
    if (v === undefined || v.startsWith("--")) throw new Failure(`${flag} needs a value\n${USAGE}`, 2);
    return v;
  };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i]!;
    if (a === "--set") set = value(++i, a);
    else if (a === "--server") server = value(++i, a);
    else if (a === "--latency") fields.latency = value(++i, a);
    else if (a === "--format") fields.format = value(++i, a);
    else if (a === "--simulator") fields.simulator = value(++i, a);
    else if (a === "--rtl-revision") fields.rtlRevision = value(++i, a);
    else if (a === "--help" || a === "-h") throw new Failure(USAGE, 0);
    else if (a.startsWith("--")) throw new Failure(`unknown argument ${a}\n${USAGE}`, 2);
    else if (spec === undefined) spec = a;
    else if (file === undefined) file = a;
    else throw new Failure(`unexpected argument ${a}\n${USAGE}`, 2);
  }
  // Split at the first "/" and the last "@": design names may contain either.
  const m = spec ? /^([^/]+)\/(.+)@([^@]+)$/.exec(spec) : null;
  if (!m || !file || !set) throw new Failure(USAGE, 2);
  if (!/^https?:\/\//.test(server)) throw new Failure(`--server must be an http(s) URL, got ${server}`, 2);
  return {
    project: m[1]!,
    design: m[2]!,
    version: m[3]!,
    set,
    file,
    server: server.replace(/\/+$/, ""),
    fields,
  };
}

interface ErrorBody {
  error?: { code?: string; message?: string };
}

async function call(url: string, init: RequestInit, notFound: string): Promise<unknown> {
  let res: Response;
  try {
    res = await fetch(url, init);
  } catch (err) {
    throw new Failure(`cannot reach ${url}: ${(err as Error).message}`, 3);
  }
  const body = (await res.json().catch(() => null)) as unknown;
  if (res.ok) return body;
  const e = (body as ErrorBody | null)?.error;
  const message = e?.message ?? res.statusText;
  if (res.status === 404) throw new Failure(`${notFound}: ${message}`, 4);
  if (res.status === 400 || res.status === 413) {
    // An unknown vector set is "not found"; anything else at 400 is the file or an option.
    if (/no vector set/.test(message)) throw new Failure(message, 4);
    throw new Failure(`refused: ${message}`, 2);
  }
  throw new Failure(`${url} answered ${res.status} (${e?.code ?? res.status}: ${message})`, 3);
}

interface Run {
  id: number;
  verdict: "pass" | "fail";
  compared: number;
  mismatches: number;
  latencySamples: number;
  latencySource: string;
  maxAbsErrorLsb: number;
  firstMismatch: {
    index: number;
    expected: { re: number; im: number };
    got: { re: number; im: number } | null;
  } | null;
  releaseWithdrawn: boolean;
  uploadSha256: string;
}

async function main(): Promise<void> {
  const args = parseArgs(process.argv.slice(2), process.env);
  const token = process.env.TAPWRIGHT_TOKEN || undefined;
  const headers: Record<string, string> = token ? { Authorization: `Bearer ${token}` } : {};
  let bytes: Buffer;
  try {
    bytes = readFileSync(args.file);
  } catch (err) {
    throw new Failure(`cannot read ${args.file}: ${(err as Error).message}`, 2);
  }
  const base = `${args.server}/api/projects/${encodeURIComponent(args.project)}/designs/${encodeURIComponent(args.design)}/releases/${encodeURIComponent(args.version)}`;
  const { release } = (await call(base, { headers }, `${args.project}/${args.design}@${args.version}`)) as {
    release: { id: number; version: string; withdrawn: { reason: string } | null };
  };
  const form = new FormData();
  form.append("vectorSet", args.set);
  for (const [k, v] of Object.entries(args.fields)) form.append(k, v);
  form.append("file", new Blob([new Uint8Array(bytes)]), path.basename(args.file));
  const { verification: v } = (await call(
    `${args.server}/api/releases/${release.id}/verifications`,
    { method: "POST", headers, body: form },
    `release ${release.version}`,
  )) as { verification: Run };
  const what = `${args.project}/${args.design} ${release.version} ${args.set}`;
  if (release.withdrawn)
    process.stderr.write(`WARNING: ${release.version} is WITHDRAWN: ${release.withdrawn.reason}\n`);
  const align = `latency ${v.latencySamples} samples, ${v.latencySource}`;
  if (v.verdict === "pass") {
    process.stdout.write(
      `PASS ${what}: ${v.compared} of ${v.compared} samples bit-exact (${align}); run ${v.id}, upload sha256 ${v.uploadSha256}\n`,
    );
    return;
  }
  const f = v.firstMismatch;
  const first = f
    ? `; first at sample ${f.index}: expected (${f.expected.re}, ${f.expected.im}), ${f.got ? `got (${f.got.re}, ${f.got.im})` : "the file ended"}`
    : "";
  throw new Failure(
    `FAIL ${what}: ${v.mismatches} of ${v.compared} samples differ${first}; largest error ${v.maxAbsErrorLsb} LSB (${align}); run ${v.id}`,
    1,
  );
}

main().catch((err: unknown) => {
  if (err instanceof Failure) {
    (err.exitCode === 0 ? process.stdout : process.stderr).write(`${err.message}\n`);
    process.exit(err.exitCode);
  }
  process.stderr.write(`verify: ${(err as Error).stack ?? String(err)}\n`);
  process.exit(3);
});
