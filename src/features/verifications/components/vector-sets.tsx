import type { VectorSet, Verification } from "@shared/schemas/verifications";
import { EmptyState } from "@/components/ui/states";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { formatCount, formatDateTime } from "@/lib/format";
import { latestPerSet } from "../lib/runs";
import { VerdictBadge } from "./verdict-badge";

/** A release's vector sets with their files, widths, headroom and the newest run's verdict. */
export function VectorSetsTable({
  sets,
  runs,
}: {
  sets: readonly VectorSet[];
  runs: readonly Verification[];
}) {
  if (sets.length === 0)
    return (
      <EmptyState title="No vector sets">This bundle's manifest describes no golden vectors.</EmptyState>
    );
  const latest = latestPerSet(runs);
  const anyAcc = sets.some((s) => s.maxAbsAccumulator !== null);
  return (
    <Table label="Vector sets" scrollable>
      <thead>
        <tr>
          <Th>Set</Th>
          <Th>Description</Th>
          <Th>Expected output</Th>
          <Th numeric>In (samples × bits)</Th>
          <Th numeric>Out (samples × bits)</Th>
          {anyAcc && <Th numeric>Largest |acc| / bound</Th>}
          <Th>Newest run</Th>
        </tr>
      </thead>
      <tbody>
        {sets.map((s) => {
          const run = latest.get(s.name);
          return (
            <Tr key={s.name}>
              <Td className="font-mono text-[13px] font-medium whitespace-nowrap">{s.name}</Td>
              <Td className="max-w-md text-xs text-ink-700">{s.description}</Td>
              <Td className="font-mono text-xs whitespace-nowrap">
                {s.expected.text}
                <br />
                {s.expected.hex}
              </Td>
              <Td numeric className="whitespace-nowrap">
                {formatCount(s.stimulus.length)} × {s.stimulus.bits}
              </Td>
              <Td numeric className="whitespace-nowrap">
                {formatCount(s.expected.length)} × {s.expected.bits}
              </Td>
              {anyAcc && (
                <Td numeric className="whitespace-nowrap">
                  {s.maxAbsAccumulator ?? "—"} / {s.accumulatorBound ?? "—"}
                </Td>
              )}
              <Td className="whitespace-nowrap">
                {run ? (
                  <span className="inline-flex items-center gap-1.5">
                    <VerdictBadge verdict={run.verdict} />
                    <span className="font-mono text-xs text-ink-700">{formatDateTime(run.at)}</span>
                  </span>
                ) : (
                  <span className="text-xs text-ink-600">not run</span>
                )}
              </Td>
            </Tr>
          );
        })}
      </tbody>
    </Table>
  );
}
