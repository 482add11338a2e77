/**
 * Command line: `npm run --silent analyze -- spec.json` (or `-` for stdin) prints the analysis JSON.
 * A spec that fails validation exits 2 with one line per problem, naming the field by its path.
 * The report's design warnings (window edge spikes, overflowed coefficients, …) are also printed to
 * stderr, one `warning: …` line each.
 */
import { readFileSync } from "node:fs";
import { ZodError } from "zod";
import { analyze } from "../shared/dsp/analysis";

function main(argv: string[]): number {
  const file = argv[0];
  if (!file || argv.length > 1) {
    process.stderr.write("usage: analyze <spec.json | ->\n");
    return 2;
  }
  let spec: unknown;
  try {
    spec = JSON.parse(readFileSync(file === "-" ? 0 : file, "utf8"));
  } catch (e) {
    process.stderr.write(`cannot read the spec: ${(e as Error).message}\n`);
    return 2;
  }
  try {
    const report = analyze(spec);
    process.stdout.write(`${JSON.stringify(report, null, 2)}\n`);
    // Design cautions go to stderr too, so a script that keeps only the JSON still shows them.
    for (const w of report.warnings ?? []) process.stderr.write(`warning: ${w}\n`);
    return 0;
  } catch (e) {
    if (e instanceof ZodError) {
      for (const issue of e.issues)
        process.stderr.write(`invalid spec: ${issue.path.join(".") || "(root)"}: ${issue.message}\n`);
      return 2;
    }
    if (e instanceof RangeError || e instanceof TypeError) {
      process.stderr.write(`invalid spec: ${e.message}\n`);
      return 2;
    }
    throw e;
  }
}

process.exitCode = main(process.argv.slice(2));
