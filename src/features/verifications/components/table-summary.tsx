import type { ReleaseSummary } from "@shared/schemas/verifications";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { formatCount } from "@/lib/format";

/** A gain as the manifest states it, without float noise (the full value in the tooltip). */
function gainText(g: number): string {
  return Number.isInteger(g) ? String(g) : Number(g.toPrecision(6)).toString();
}

/** Datapath fields in a fixed, readable order; unknown ones follow as they come. */
const DATAPATH_ORDER = [
  "inputBits",
  "accumulatorBits",
  "outputBits",
  "outputShift",
  "rounding",
  "overflow",
] as const;
const DATAPATH_LABEL: Record<string, string> = {
  inputBits: "in",
  accumulatorBits: "acc",
  outputBits: "out",
  outputShift: "shift",
  rounding: "round",
  overflow: "ovf",
};

function datapathText(d: Record<string, unknown> | null): string {
  if (!d) return "—";
  const keys = [
    ...DATAPATH_ORDER.filter((k) => k in d),
    ...Object.keys(d).filter((k) => !(DATAPATH_ORDER as readonly string[]).includes(k)),
  ];
  return keys.map((k) => `${DATAPATH_LABEL[k] ?? k} ${String(d[k])}`).join(" · ") || "—";
}

/** Per-table summary from the manifest: length, W/F, signedness, gain, rounding, overflow, datapath. */
export function TableSummaryTable({ summary }: { summary: ReleaseSummary }) {
  const anyDatapath = summary.tables.some((t) => t.datapath);
  return (
    <Table label="Coefficient tables">
      <thead>
        <tr>
          <Th>Table</Th>
          <Th>Values</Th>
          <Th numeric>Length</Th>
          <Th numeric>W</Th>
          <Th numeric>F</Th>
          <Th>Signed</Th>
          <Th numeric>Gain</Th>
          <Th>Rounding</Th>
          <Th>Overflow</Th>
          <Th numeric>Overflows</Th>
          {anyDatapath && <Th>Datapath</Th>}
        </tr>
      </thead>
      <tbody>
        {summary.tables.map((t) => (
          <Tr key={t.role}>
            <Td className="font-mono text-[13px] font-medium">{t.role}</Td>
            <Td>{t.complex ? "complex" : "real"}</Td>
            <Td numeric>{formatCount(t.length)}</Td>
            <Td numeric>{t.wordLength}</Td>
            <Td numeric>{t.fractionLength}</Td>
            <Td>{t.signed ? "signed" : "unsigned"}</Td>
            <Td numeric>
              <span title={String(t.gain)}>{gainText(t.gain)}</span>
            </Td>
            <Td className="font-mono text-[13px]">{t.rounding}</Td>
            <Td className="font-mono text-[13px]">{t.overflow}</Td>
            <Td numeric className={t.overflowCount > 0 ? "text-warn-800" : undefined}>
              {formatCount(t.overflowCount)}
            </Td>
            {anyDatapath && <Td className="font-mono text-xs">{datapathText(t.datapath)}</Td>}
          </Tr>
        ))}
      </tbody>
    </Table>
  );
}
