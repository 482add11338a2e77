import { useSearchParams } from "react-router-dom";
import { compareVersions, type Release } from "@shared/schemas/releases";
import type { ReleaseDiff } from "@shared/schemas/release-diff";
import { Field } from "@/components/ui/field";
import { Section } from "@/components/ui/page";
import { EmptyState, ErrorState, TableSkeleton } from "@/components/ui/states";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { formatDiff, formatMetric } from "@/features/analysis/lib/format-metric";
import { formatCount } from "@/lib/format";
import { useReleaseDiff } from "../api/get-release-diff";
import { useReleases } from "../api/get-releases";
import { fieldLabel, formatLsb, metricView, specValue, visibleMetrics } from "../lib/diff-view";

const SELECT =
  "h-8 w-full rounded border border-paper-400 bg-white px-2 text-sm text-ink-900 focus:border-signal-600 focus:outline-none focus-visible:outline-2 focus-visible:outline-signal-500";

function SpecTable({ diff }: { diff: ReleaseDiff }) {
  if (diff.spec.length === 0)
    return <p className="text-sm text-ink-700">No fixed-point spec field changed.</p>;
  return (
    <Table label="Changed spec fields">
      <thead>
        <tr>
          <Th>Table</Th>
          <Th>Field</Th>
          <Th numeric>{diff.from.version}</Th>
          <Th numeric>{diff.to.version}</Th>
        </tr>
      </thead>
      <tbody>
        {diff.spec.map((c) => (
          <Tr key={`${c.table}.${c.field}`}>
            <Td className="font-mono text-[13px]">{c.table}</Td>
            <Td>{fieldLabel(c.field)}</Td>
            <Td numeric>{specValue(c, "from")}</Td>
            <Td numeric>{specValue(c, "to")}</Td>
          </Tr>
        ))}
      </tbody>
    </Table>
  );
}

function CoefficientTable({ diff }: { diff: ReleaseDiff }) {
  return (
    <Table label="Coefficient changes">
      <thead>
        <tr>
          <Th>Table</Th>
          <Th numeric>Taps</Th>
          <Th numeric>Changed words (I and Q)</Th>
          <Th numeric>Max change (LSB of {diff.to.version})</Th>
          <Th numeric>At tap</Th>
        </tr>
      </thead>
      <tbody>
        {diff.tables.map((t) => (
          <Tr key={t.table}>
            <Td className="font-mono text-[13px]">{t.table}</Td>
            <Td numeric>
              {t.lengthFrom === t.lengthTo
                ? String(t.lengthTo ?? "—")
                : `${t.lengthFrom ?? "—"} → ${t.lengthTo ?? "—"}`}
            </Td>
            <Td numeric>{t.changedWords === null ? "—" : formatCount(t.changedWords)}</Td>
            <Td numeric data-testid={`max-lsb-${t.table}`}>
              {formatLsb(t.maxChangeLsb)}
            </Td>
            <Td numeric>{t.atIndex ?? "—"}</Td>
          </Tr>
        ))}
      </tbody>
    </Table>
  );
}

function MetricTable({ diff }: { diff: ReleaseDiff }) {
  const rows = visibleMetrics(diff.kind, diff.metrics);
  return (
    <Table label="Metric changes">
      <thead>
        <tr>
          <Th>Metric</Th>
          <Th numeric>{diff.from.version} float</Th>
          <Th numeric>{diff.from.version} fixed</Th>
          <Th numeric>{diff.to.version} float</Th>
          <Th numeric>{diff.to.version} fixed</Th>
          <Th numeric>Change, fixed</Th>
        </tr>
      </thead>
      <tbody>
        {rows.map((m) => {
          const v = metricView(diff.kind, m.key);
          const unit = v.unit ?? "ratio";
          // A null SQNR means the words hold the float values exactly (report definition), not a missing figure.
          const none = m.key.startsWith("coefficientSqnrDb.") ? "exact" : "—";
          return (
            <Tr key={m.key}>
              <Td>{v.label}</Td>
              <Td numeric>{formatMetric(m.from.float, unit)}</Td>
              <Td numeric>{formatMetric(m.from.fixed, unit, none)}</Td>
              <Td numeric>{formatMetric(m.to.float, unit)}</Td>
              <Td numeric>{formatMetric(m.to.fixed, unit, none)}</Td>
              <Td numeric>{formatDiff(m.deltaFixed, unit)}</Td>
            </Tr>
          );
        })}
      </tbody>
    </Table>
  );
}

/** The diff body for one chosen pair. */
function DiffResult({ releaseId, against }: { releaseId: number; against: number }) {
  const diff = useReleaseDiff(releaseId, against);
  if (diff.isPending) return <TableSkeleton label="Comparing releases" rows={4} />;
  if (diff.isError) return <ErrorState error={diff.error} onRetry={() => void diff.refetch()} />;
  const d = diff.data;
  return (
    <div className="flex flex-col gap-4">
      <p className="text-sm text-ink-700">
        {d.from.version} (r{d.from.revisionNumber}) → {d.to.version} (r{d.to.revisionNumber}).{" "}
        {d.sameContent
          ? "Same content hash: the tables and specs are identical."
          : "Words are compared as the values they stand for (code·2^−F)."}
      </p>
      <div>
        <h3 className="mb-1.5 text-xs font-semibold tracking-wide text-ink-700 uppercase">
          Fixed-point spec
        </h3>
        <SpecTable diff={d} />
      </div>
      <div>
        <h3 className="mb-1.5 text-xs font-semibold tracking-wide text-ink-700 uppercase">Coefficients</h3>
        <CoefficientTable diff={d} />
      </div>
      <div>
        <h3 className="mb-1.5 text-xs font-semibold tracking-wide text-ink-700 uppercase">
          Metrics (float and fixed)
        </h3>
        <MetricTable diff={d} />
      </div>
    </div>
  );
}

/** "Compare with": a select of the design's other releases (choice kept in `?against=`), then the diff. */
export function ReleaseDiffSection({ release }: { release: Release }) {
  const [params, setParams] = useSearchParams();
  const siblings = useReleases({ design: release.designId });
  const others = (siblings.data ?? []).filter((r) => r.id !== release.id);
  const raw = params.get("against");
  const chosen = raw && others.some((r) => String(r.id) === raw) ? Number(raw) : null;
  // Without a choice, compare with the nearest earlier version: the usual question when a new one lands.
  const earlier = others
    .filter((r) => compareVersions(r.version, release.version) < 0)
    .sort((a, b) => compareVersions(b.version, a.version));
  const against = chosen ?? earlier[0]?.id ?? null;

  return (
    <Section title="Changes against another release">
      {siblings.isPending ? (
        <TableSkeleton label="Loading releases of this design" rows={2} />
      ) : siblings.isError ? (
        <ErrorState error={siblings.error} onRetry={() => void siblings.refetch()} />
      ) : others.length === 0 ? (
        <EmptyState title="Nothing to compare with">This is the design&rsquo;s only release.</EmptyState>
      ) : (
        <div className="flex flex-col gap-3">
          <div className="max-w-xs">
            <Field label="Compare with">
              {({ id }) => (
                <select
                  id={id}
                  className={SELECT}
                  value={against === null ? "" : String(against)}
                  onChange={(e) => {
                    const next = new URLSearchParams(params);
                    if (e.target.value) next.set("against", e.target.value);
                    else next.delete("against");
                    setParams(next, { replace: true });
                  }}
                >
                  {against === null && <option value="">Choose a release</option>}
                  {others.map((r) => (
                    <option key={r.id} value={r.id}>
                      {r.version} (r{r.revisionNumber}){r.withdrawn ? ", withdrawn" : ""}
                    </option>
                  ))}
                </select>
              )}
            </Field>
          </div>
          {against !== null && <DiffResult releaseId={release.id} against={against} />}
        </div>
      )}
    </Section>
  );
}
