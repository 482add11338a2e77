// A vitest reporter used by scripts/test.mjs: counts every failure, not only failed tests. A failed test counts
// once; so does every file or suite with errors of its own (a failed import, beforeAll or afterAll hook) and every
// unhandled error. Writes { passed, failed, problems } to TAPWRIGHT_TEST_SUMMARY as JSON. Node built-ins only.
import { mkdirSync, writeFileSync } from "node:fs";
import path from "node:path";

export default class SummaryReporter {
  onTestRunEnd(testModules, unhandledErrors, reason) {
    let passed = 0;
    let failed = 0;
    const problems = [];
    for (const mod of testModules) {
      for (const test of mod.children.allTests()) {
        const state = test.result().state;
        if (state === "passed") passed += 1;
        else if (state === "failed") failed += 1;
      }
      for (const suite of [mod, ...mod.children.allSuites()]) {
        const errors = suite.errors();
        if (errors.length === 0) continue;
        failed += 1;
        const where = suite.type === "module" ? mod.moduleId : `${mod.moduleId} > ${suite.fullName}`;
        problems.push(`${path.relative(process.cwd(), where)}: ${errors[0]?.message ?? "error"}`);
      }
    }
    for (const err of unhandledErrors) {
      failed += 1;
      problems.push(`unhandled error: ${err.message ?? String(err)}`);
    }
    const out = process.env.TAPWRIGHT_TEST_SUMMARY;
    if (out) {
      mkdirSync(path.dirname(out), { recursive: true });
      writeFileSync(out, JSON.stringify({ passed, failed, problems, reason }));
    }
  }
}
