import type { ReviewPage } from "@shared/schemas/reviews";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { formatDiff, formatMetric } from "@/features/analysis/lib/format-metric";
import { compareFigures } from "../lib/figures";

/** This revision's fixed-point figures beside the previous release's, with the difference (new − previous). */
export function FiguresTable({ page }: { page: ReviewPage }) {
  const prev = page.previousRelease;
  const rows = compareFigures(page.design.kind, page.report, prev?.report ?? null);
  if (rows.length === 0) return <p className="text-sm text-ink-600">The report has no figures to compare.</p>;
  const prevLabel = prev ? `${prev.version} (r${prev.revisionNumber})` : null;
  return (
    <Table label="Figures against the previous release">
      <thead>
        <tr>
          <Th>Metric (fixed point)</Th>
          <Th numeric>r{page.revision.number}</Th>
          {prevLabel && <Th numeric>Release {prevLabel}</Th>}
          {prevLabel && <Th numeric>Difference</Th>}
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <Tr key={r.key}>
            <Td>{r.label}</Td>
            <Td numeric>{formatMetric(r.current, r.unit)}</Td>
            {prevLabel && <Td numeric>{formatMetric(r.previous, r.unit)}</Td>}
            {prevLabel && <Td numeric>{formatDiff(r.delta, r.unit)}</Td>}
          </Tr>
        ))}
      </tbody>
    </Table>
  );
}
