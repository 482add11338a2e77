// `npm run pull` against a running test server, spawned as a build script would run it; the unpacked folder
// is then checked with coreutils' sha256sum -c.
import { execFile, execFileSync } from "node:child_process";
import { mkdtempSync, readdirSync, rmSync } from "node:fs";
import type { AddressInfo } from "node:net";
import type { Server } from "node:http";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { CreatedTokenSchema } from "../../shared/schemas/tokens";
import { useApiTestDatabase } from "./helpers";
import { releasedDesign } from "./bundles-helpers";
import { signedIn } from "./lifecycle-helpers";

const t = useApiTestDatabase();

function pull(
  args: string[],
  env: Record<string, string>,
): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile(
      "npm",
      ["run", "--silent", "pull", "--", ...args],
      { cwd: process.cwd(), env: { ...process.env, ...env }, timeout: 60_000 },
      (err, stdout, stderr) =>
        resolve({ code: err ? ((err as { code?: number }).code ?? 1) : 0, stdout, stderr }),
    );
  });
}

describe("npm run pull", () => {
  let server: Server;
  let url: string;
  let design: string;
  let secret: string;
  const dirs: string[] = [];
  const tempDir = () => {
    const d = mkdtempSync(path.join(tmpdir(), "tapwright-pull-"));
    dirs.push(d);
    return d;
  };

  beforeAll(async () => {
    const r = await releasedDesign(t, undefined, "1.0.0");
    design = r.release.designName;
    const firmware = await signedIn(t.app, "firmware");
    secret = CreatedTokenSchema.parse(
      (await firmware.post("/api/tokens").send({ name: "pull test" })).body,
    ).secret;
    server = await new Promise<Server>((resolve) => {
      const s = t.app.listen(0, "127.0.0.1", () => resolve(s));
    });
    url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  });

  afterAll(async () => {
    await new Promise<void>((resolve) => server?.close(() => resolve()));
    for (const d of dirs) rmSync(d, { recursive: true, force: true });
  });

  it("downloads coastwatch-s/<design>@latest with a token, verifies every checksum and unpacks; sha256sum -c agrees", async () => {
    const out = path.join(tempDir(), "bundle");
    const r = await pull([`coastwatch-s/${design}@latest`, "--out", out], {
      TAPWRIGHT_URL: url,
      TAPWRIGHT_TOKEN: secret,
    });
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/1\.0\.0: \d+ files verified/);
    const check = execFileSync("sha256sum", ["-c", "--strict", "SHA256SUMS"], { cwd: out, encoding: "utf8" });
    expect(check).not.toMatch(/FAILED/);
    expect(readdirSync(out).sort()).toEqual([
      "README.txt",
      "SHA256SUMS",
      "golden",
      "hdl",
      "manifest.json",
      "manifest.schema.json",
      "report",
      "tables",
    ]);
  });

  it("an explicit version works too; a missing version, a bad token and a non-empty folder fail with a message and a non-zero exit", async () => {
    const ok = await pull([`coastwatch-s/${design}@1.0.0`, "--out", path.join(tempDir(), "b")], {
      TAPWRIGHT_URL: url,
      TAPWRIGHT_TOKEN: secret,
    });
    expect(ok.code, ok.stderr).toBe(0);
    const missing = await pull([`coastwatch-s/${design}@9.9.9`, "--out", path.join(tempDir(), "c")], {
      TAPWRIGHT_URL: url,
      TAPWRIGHT_TOKEN: secret,
    });
    expect(missing.code).toBe(3);
    expect(missing.stderr).toMatch(/404/);
    const bad = await pull([`coastwatch-s/${design}@latest`, "--out", path.join(tempDir(), "d")], {
      TAPWRIGHT_URL: url,
      TAPWRIGHT_TOKEN: `tw_${"x".repeat(43)}`,
    });
    expect(bad.code).toBe(3);
    expect(bad.stderr).toMatch(/401/);
    const full = tempDir();
    execFileSync("touch", [path.join(full, "keep")]);
    const nonEmpty = await pull([`coastwatch-s/${design}@latest`, "--out", full], {
      TAPWRIGHT_URL: url,
      TAPWRIGHT_TOKEN: secret,
    });
    expect(nonEmpty.code).toBe(2);
    const usage = await pull(["no-at-sign", "--out", full], { TAPWRIGHT_URL: url });
    expect(usage.code).toBe(2);
    expect(usage.stderr).toMatch(/usage:/);
  });
});
