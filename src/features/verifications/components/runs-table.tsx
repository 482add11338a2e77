import { useState } from "react";
import type { Verification } from "@shared/schemas/verifications";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/states";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { formatCount, formatDateTime } from "@/lib/format";
import { sampleText } from "../lib/runs";
import { RunErrorPlot } from "./error-plot";
import { VerdictBadge } from "./verdict-badge";

function FirstMismatch({ run }: { run: Verification }) {
  const f = run.firstMismatch;
  if (!f) return <span className="text-ink-600">—</span>;
  return (
    <span className="font-mono text-xs whitespace-nowrap">
      #{f.index}: {sampleText(f.expected)} → {f.got ? sampleText(f.got) : "end of file"}
    </span>
  );
}

/** Every run of a release, newest first, with verdict, first mismatch and the error plot of the one chosen. */
export function RunsTable({ releaseId, runs }: { releaseId: number; runs: readonly Verification[] }) {
  const [chosen, setChosen] = useState<number | null>(null);
  if (runs.length === 0)
    return (
      <EmptyState title="No verification run yet">
        Upload the simulation output of your RTL for a vector set; it is compared bit-exactly with the
        expected output and kept as evidence.
      </EmptyState>
    );
  const shown = runs.find((r) => r.id === chosen) ?? runs.find((r) => r.verdict === "fail") ?? runs[0]!;
  return (
    <div className="flex flex-col gap-3">
      <Table label="Verification runs">
        <thead>
          <tr>
            <Th numeric>Run</Th>
            <Th>Recorded</Th>
            <Th>Set</Th>
            <Th>Verdict</Th>
            <Th numeric>Mismatches / compared</Th>
            <Th>First mismatch: expected → got</Th>
            <Th numeric title="Largest |got − expected| over the compared samples, in output LSBs">
              Max err
            </Th>
            <Th numeric>Latency</Th>
            <Th>Source · upload</Th>
            <Th>
              <span className="sr-only">Plot</span>
            </Th>
          </tr>
        </thead>
        <tbody>
          {runs.map((r) => (
            <Tr key={r.id} aria-current={r.id === shown.id ? "true" : undefined}>
              <Td numeric>{r.id}</Td>
              <Td className="font-mono text-[13px] whitespace-nowrap">{formatDateTime(r.at)}</Td>
              <Td className="font-mono text-[13px]">{r.vectorSet}</Td>
              <Td className="whitespace-nowrap">
                <VerdictBadge verdict={r.verdict} />{" "}
                {r.releaseWithdrawn && (
                  <Badge tone="neutral" className="ml-1">
                    on withdrawn
                  </Badge>
                )}
              </Td>
              <Td numeric className="whitespace-nowrap">
                <span className={r.mismatches > 0 ? "text-fail-700" : undefined}>
                  {formatCount(r.mismatches)}
                </span>
                <span className="text-ink-600"> / {formatCount(r.compared)}</span>
              </Td>
              <Td>
                <FirstMismatch run={r} />
              </Td>
              <Td numeric>{formatCount(r.maxAbsErrorLsb)}</Td>
              <Td
                numeric
                title={
                  r.latencySource === "searched"
                    ? "found by the search over leading samples"
                    : "declared with the upload"
                }
              >
                {r.latencySamples}
                {r.latencySource === "searched" ? "" : "*"}
              </Td>
              <Td className="max-w-48 text-xs leading-4">
                <span
                  className="block truncate"
                  title={`${r.simulator ?? "—"} · RTL ${r.rtlRevision ?? "—"}`}
                >
                  {r.simulator ?? "no simulator named"} ·{" "}
                  <span className="font-mono">{r.rtlRevision ?? "—"}</span>
                </span>
                <span className="block truncate text-ink-600">
                  <a
                    href={`/api/releases/${releaseId}/verifications/${r.id}/upload`}
                    download
                    className="font-mono text-signal-800 underline-offset-2 hover:underline"
                    title={`${r.fileName}, SHA-256 ${r.uploadSha256}`}
                  >
                    {r.fileName}
                  </a>{" "}
                  · {r.by.displayName}
                </span>
              </Td>
              <Td>
                <Button
                  size="sm"
                  variant="ghost"
                  aria-pressed={r.id === shown.id}
                  aria-label={`Plot the error of run ${r.id}`}
                  onClick={() => setChosen(r.id)}
                >
                  Plot
                </Button>
              </Td>
            </Tr>
          ))}
        </tbody>
      </Table>
      <p className="-mt-2 text-xs text-ink-600">
        Latency in samples skipped before the comparison; * declared with the upload, otherwise found by the
        search over leading samples.
      </p>
      <RunErrorPlot key={shown.id} run={shown} />
    </div>
  );
}
