// `npm run verify` against a running test server, spawned as a build script would run it, with a
// verify-scope token: each exit status of its contract (0 pass, 1 fail, 2 usage/refused file, 3 network,
// 4 not found).
import { execFile } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import type { AddressInfo } from "node:net";
import type { Server } from "node:http";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { CreatedTokenSchema } from "../../shared/schemas/tokens";
import { bundleOf, releasedDesign, unzipToTemp } from "./bundles-helpers";
import { useApiTestDatabase } from "./helpers";
import { signedIn } from "./lifecycle-helpers";

const t = useApiTestDatabase();

function verify(
  args: string[],
  env: Record<string, string>,
): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile(
      "npm",
      ["run", "--silent", "verify", "--", ...args],
      { cwd: process.cwd(), env: { ...process.env, ...env }, timeout: 60_000 },
      (err, stdout, stderr) =>
        resolve({ code: err ? ((err as { code?: number }).code ?? 1) : 0, stdout, stderr }),
    );
  });
}

describe("npm run verify", () => {
  let server: Server;
  let env: Record<string, string>;
  let spec: string;
  let dir: string;
  let expectedPath: string;
  let brokenPath: string;
  let badPath: string;

  beforeAll(async () => {
    const r = await releasedDesign(t, undefined, "1.0.0");
    spec = `coastwatch-s/${r.release.designName}@latest`;
    const firmware = await signedIn(t.app, "firmware");
    const secret = CreatedTokenSchema.parse(
      (await firmware.post("/api/tokens").send({ name: "verify test", scope: "verify" })).body,
    ).secret;
    const bundle = unzipToTemp((await bundleOf(firmware, r.release.id)).body);
    dir = mkdtempSync(path.join(tmpdir(), "tapwright-verify-script-"));
    const expected = bundle.read("golden/scenario/expected.txt").toString("utf8");
    bundle.cleanup();
    expectedPath = path.join(dir, "sim_out.txt");
    writeFileSync(expectedPath, `# captured by the testbench\n${expected}`);
    // Sample 3 off by one LSB in I.
    const lines = expected.split("\n");
    const [re, im] = lines[3]!.split(" ").map(Number);
    lines[3] = `${re! + 1} ${im}`;
    brokenPath = path.join(dir, "sim_broken.txt");
    writeFileSync(brokenPath, lines.join("\n"));
    badPath = path.join(dir, "sim_bad.txt");
    writeFileSync(badPath, "1 2\n3 four\n");
    server = await new Promise<Server>((resolve) => {
      const s = t.app.listen(0, "127.0.0.1", () => resolve(s));
    });
    env = {
      TAPWRIGHT_URL: `http://127.0.0.1:${(server.address() as AddressInfo).port}`,
      TAPWRIGHT_TOKEN: secret,
    };
  });

  afterAll(async () => {
    await new Promise<void>((resolve) => server?.close(() => resolve()));
    if (dir) rmSync(dir, { recursive: true, force: true });
  });

  it("exits 0 with PASS for a bit-exact output and 1 with the first mismatch for a broken one", async () => {
    const pass = await verify([spec, "--set", "scenario", expectedPath, "--simulator", "Icarus"], env);
    expect(pass.code, pass.stderr).toBe(0);
    expect(pass.stdout).toMatch(/^PASS coastwatch-s\/.* 1\.0\.0 scenario: (\d+) of \1 samples bit-exact/);
    const fail = await verify([spec, "--set", "scenario", brokenPath, "--latency", "0"], env);
    expect(fail.code).toBe(1);
    expect(fail.stderr).toMatch(/^FAIL .*: 1 of \d+ samples differ; first at sample 3: expected \(/);
    expect(fail.stderr).toMatch(/largest error 1 LSB/);
  });

  it("exits 2 for usage and for a file the server refuses, naming its line and column", async () => {
    expect((await verify([spec, expectedPath], env)).code).toBe(2);
    const bad = await verify([spec, "--set", "scenario", badPath], env);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/sim_bad\.txt, line 2, column 3: expected a decimal integer \(Q/);
    expect((await verify([spec, "--set", "scenario", path.join(dir, "missing.txt")], env)).code).toBe(2);
  });

  it("exits 4 for an unknown release or vector set and 3 when the server cannot be reached", async () => {
    const none = await verify(["coastwatch-s/No such design@1.0.0", "--set", "scenario", expectedPath], env);
    expect(none.code).toBe(4);
    expect((await verify([spec, "--set", "no-such-set", expectedPath], env)).code).toBe(4);
    const down = await verify([spec, "--set", "scenario", expectedPath], {
      ...env,
      TAPWRIGHT_URL: "http://127.0.0.1:9",
    });
    expect(down.code).toBe(3);
    expect(down.stderr).toMatch(/cannot reach/);
  });
});
