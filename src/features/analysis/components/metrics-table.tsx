import { Badge } from "@/components/ui/badge";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { formatDb } from "@/lib/format";
import { formatDiff, formatMetric } from "../lib/format-metric";
import { LIMIT_VIEW, type MetricRow } from "../lib/metric-rows";

/** The dense metrics table: float | fixed | difference | limit | verdict, numbers mono and right-aligned. */
export function MetricsTable({ rows }: { rows: MetricRow[] }) {
  return (
    <Table label="Metrics">
      <thead>
        <tr>
          <Th>Metric</Th>
          <Th numeric>Float</Th>
          <Th numeric>Fixed</Th>
          <Th numeric>Difference</Th>
          <Th numeric>Limit</Th>
          <Th>Verdict</Th>
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <Tr key={r.key}>
            <Td>{r.label}</Td>
            <Td numeric>{formatMetric(r.float, r.unit)}</Td>
            <Td numeric>{formatMetric(r.fixed, r.unit, r.key.startsWith("sqnr-") ? "exact" : "—")}</Td>
            <Td numeric>{formatDiff(r.diff, r.unit)}</Td>
            <Td numeric>
              {r.check
                ? `${LIMIT_VIEW[r.check.name].bound === "max" ? "≤" : "≥"} ${formatDb(r.check.limit)}`
                : "—"}
            </Td>
            <Td>
              {r.check ? (
                <Badge tone={r.check.pass ? "pass" : "fail"}>{r.check.pass ? "Pass" : "Fail"}</Badge>
              ) : (
                <span className="text-ink-600">not judged</span>
              )}
            </Td>
          </Tr>
        ))}
      </tbody>
    </Table>
  );
}
