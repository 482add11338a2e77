import { Link, useNavigate, useParams } from "react-router-dom";
import type { AnalysisReport } from "@shared/dsp/analysis";
import { Badge } from "@/components/ui/badge";
import { CopyButton } from "@/components/ui/copy-button";
import { PageHeader, Section } from "@/components/ui/page";
import { EmptyState, ErrorState, TableSkeleton } from "@/components/ui/states";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { gainText, wordText } from "@shared/report-format";
import { VERDICT_WORDS, verdictOf } from "@shared/report-words";
import { ApiError } from "@/lib/api-client";
import { VERDICT_TONE } from "@/lib/verdict";
import { formatDateTime, formatDb } from "@/lib/format";
import { useReport, type ReportDocument } from "../api/get-report";
import { assumptions } from "../lib/assumptions";
import { formatMetric } from "../lib/format-metric";
import { limitChips, metricRows } from "../lib/metric-rows";
import { DatapathTable } from "./datapath-table";
import { LimitChipStrip } from "./limit-chips";
import { MetricsTable } from "./metrics-table";
import { ReportPlots } from "./report-plots";
import { UseRecommendedW } from "./use-recommended-w";
import { useRevision } from "@/features/revisions/api/get-revision";

const LINK = "inline-flex h-8 items-center rounded border px-3 text-sm font-medium";

/** `/revisions/:id/report`: the fixed-point report of a revision's current content. */
export function ReportPage() {
  const id = Number(useParams().id);
  const doc = useReport(id);
  if (doc.isPending) return <TableSkeleton rows={8} label="Loading the report" />;
  if (doc.isError) {
    if (doc.error instanceof ApiError && doc.error.status === 404)
      return (
        <EmptyState
          title="No report yet"
          action={
            <Link className="text-sm font-medium text-signal-800 underline" to={`/revisions/${id}`}>
              Back to the revision
            </Link>
          }
        >
          The current content of this revision has not been analysed, or its analysis is still running. Run it
          from the revision page.
        </EmptyState>
      );
    return <ErrorState error={doc.error} onRetry={() => void doc.refetch()} />;
  }
  return <ReportView id={id} doc={doc.data} />;
}

function ReportView({ id, doc }: { id: number; doc: ReportDocument }) {
  const { header, report } = doc;
  return (
    <div>
      <PageHeader
        title={
          <>
            Report · {header.design} <span className="font-mono">{header.revision}</span>
          </>
        }
        subtitle={
          <span className="flex flex-wrap items-center gap-x-4 gap-y-1">
            <span>{header.project}</span>
            <span className="inline-flex items-center gap-1.5">
              content{" "}
              <span className="font-mono text-xs" title={header.contentHash}>
                {header.contentHash.slice(0, 12)}…
              </span>
              <CopyButton value={header.contentHash} label="Copy hash" />
            </span>
            <span>
              generated <span className="font-mono text-xs">{formatDateTime(header.generatedAt)}</span>
            </span>
            <span>
              software <span className="font-mono text-xs">{header.softwareVersion}</span>
            </span>
          </span>
        }
        action={
          <>
            <a
              className={`${LINK} border-paper-400 bg-paper-50 text-ink-800 hover:bg-paper-200`}
              href={`/api/revisions/${id}/report.json`}
              download
            >
              JSON
            </a>
            <a
              className={`${LINK} border-signal-800 bg-signal-700 text-white hover:bg-signal-800`}
              href={`/api/revisions/${id}/report.html`}
              target="_blank"
              rel="noopener"
            >
              Printable report
            </a>
          </>
        }
      />
      <Section
        title="Acceptance limits"
        action={<Badge tone={VERDICT_TONE[verdictOf(report)]}>{VERDICT_WORDS[verdictOf(report)]}</Badge>}
      >
        <LimitChipStrip groups={limitChips(report)} />
      </Section>
      <Section title="Metrics: float vs fixed point">
        <MetricsTable rows={metricRows(report)} />
      </Section>
      <Section title="Plots">
        <ReportPlots report={report} />
      </Section>
      {report.sweep && (
        <Section title="Bit-width sweep">
          <SweepTable report={report} revisionId={id} />
        </Section>
      )}
      {report.doppler && (
        <Section title="Doppler cut">
          <DopplerTable doppler={report.doppler} />
        </Section>
      )}
      <Section title="Tables and accumulator">
        <TablesTable report={report} />
      </Section>
      <Section title="Datapath">
        <DatapathTable report={report} />
      </Section>
      <Section title="Assumptions">
        <ul className="list-disc pl-5 text-sm text-ink-800">
          {assumptions(report).map((a) => (
            <li key={a}>{a}</li>
          ))}
        </ul>
      </Section>
    </div>
  );
}

const SWEEP_COLUMNS: Record<AnalysisReport["kind"], [string, string][]> = {
  waveform: [
    ["pslDb", "PSL"],
    ["islrDb", "ISLR"],
    ["mismatchLossDb", "Mismatch loss"],
    ["peakLossDb", "Peak loss"],
    ["coefficientSqnrDb", "SQNR"],
  ],
  filter: [
    ["stopbandAttenuationDb", "Stopband att."],
    ["passbandRippleDb", "Ripple"],
    ["coefficientSqnrDb", "SQNR"],
  ],
};

function SweepTable({ report, revisionId }: { report: AnalysisReport; revisionId: number }) {
  const sweep = report.sweep!;
  const cols = SWEEP_COLUMNS[report.kind];
  const judged = verdictOf(report) !== "not-judged";
  const best = judged ? sweep.smallestPassingWordLength : null;
  const revision = useRevision(revisionId);
  const navigate = useNavigate();
  return (
    <div className="flex flex-col gap-2">
      <p className="flex flex-wrap items-center gap-x-3 gap-y-1 text-sm text-ink-800">
        {!judged ? (
          <>
            No acceptance limits are set: no word length is judged or recommended. Set limits on the revision.
          </>
        ) : best === null ? (
          <>No word length in the sweep meets every limit.</>
        ) : (
          <>
            Recommended word length: <span className="font-mono font-semibold">W = {best}</span>, the smallest
            that meets every limit (table
            {sweep.tables.length > 1 ? "s" : ""} <span className="font-mono">{sweep.tables.join(", ")}</span>{" "}
            varied, integer bits kept).
            {best === Math.min(...sweep.rows.map((r) => r.wordLength)) && (
              <>
                {" "}
                It is the lowest W tried: a smaller one may pass too; widen the sweep on the revision page.
              </>
            )}
          </>
        )}
        {revision.data && (
          <UseRecommendedW
            report={report}
            detail={revision.data}
            onApplied={() => navigate(`/revisions/${revisionId}`)}
          />
        )}
      </p>
      <Table label="Bit-width sweep">
        <thead>
          <tr>
            <Th numeric>W</Th>
            {cols.map(([k, label]) => (
              <Th key={k} numeric>
                {label}
              </Th>
            ))}
            <Th>Method</Th>
            <Th>Verdict</Th>
          </tr>
        </thead>
        <tbody>
          {sweep.rows.map((r) => (
            <Tr key={r.wordLength} className={r.wordLength === best ? "bg-signal-50" : undefined}>
              <Td numeric>{r.wordLength === best ? `▶ ${r.wordLength}` : r.wordLength}</Td>
              {cols.map(([k]) => (
                <Td key={k} numeric>
                  {formatMetric(r.figures[k], "dB", k === "coefficientSqnrDb" ? "exact" : "—")}
                </Td>
              ))}
              <Td className="text-xs text-ink-700">{r.method}</Td>
              <Td>
                {judged ? (
                  <Badge tone={r.pass ? "pass" : "fail"}>{r.pass ? "Pass" : "Fail"}</Badge>
                ) : (
                  <span className="text-xs text-ink-600">not judged</span>
                )}
              </Td>
            </Tr>
          ))}
        </tbody>
      </Table>
    </div>
  );
}

function DopplerTable({ doppler }: { doppler: NonNullable<AnalysisReport["doppler"]> }) {
  const rows: [string, number | null | undefined, number | null | undefined, "dB" | "samples" | "m"][] = [
    ["Peak loss vs zero Doppler", doppler.float.peakLossDb, doppler.fixed.peakLossDb, "dB"],
    ["PSL", doppler.float.pslDb, doppler.fixed.pslDb, "dB"],
    ["Range shift", doppler.float.rangeShiftSamples, doppler.fixed.rangeShiftSamples, "samples"],
    ["Range shift", doppler.float.rangeShiftMetres, doppler.fixed.rangeShiftMetres, "m"],
  ];
  return (
    <Table label="Doppler cut">
      <thead>
        <tr>
          <Th>Figure</Th>
          <Th numeric>Float</Th>
          <Th numeric>Fixed</Th>
        </tr>
      </thead>
      <tbody>
        {rows.map(([label, f, x, unit]) => (
          <Tr key={`${label}-${unit}`}>
            <Td>{label}</Td>
            <Td numeric>{formatMetric(f, unit)}</Td>
            <Td numeric>{formatMetric(x, unit)}</Td>
          </Tr>
        ))}
      </tbody>
    </Table>
  );
}

function TablesTable({ report }: { report: AnalysisReport }) {
  return (
    <Table label="Tables and accumulator">
      <thead>
        <tr>
          <Th>Table</Th>
          <Th numeric>Length</Th>
          <Th>Format</Th>
          <Th>Rounding / overflow</Th>
          <Th numeric>Gain</Th>
          <Th numeric>Overflowed</Th>
          <Th numeric>SQNR</Th>
          <Th numeric>Accumulator (worst case → recommended)</Th>
        </tr>
      </thead>
      <tbody>
        {report.tables.map((t) => {
          const fp = t.fixedPoint;
          return (
            <Tr key={t.role}>
              <Td className="font-mono">{t.role}</Td>
              <Td numeric>{t.length}</Td>
              <Td className="font-mono text-[13px]">
                {wordText(fp)}, {fp.scaling}
              </Td>
              <Td className="text-xs">
                {fp.rounding} / {fp.overflow}
              </Td>
              <Td numeric>{gainText(t.gain)}</Td>
              <Td numeric className={t.overflowCount > 0 ? "text-fail-700" : undefined}>
                {t.overflowCount}
              </Td>
              <Td numeric>{t.coefficientSqnrDb === null ? "exact" : formatDb(t.coefficientSqnrDb)}</Td>
              <Td numeric>
                {t.accumulator
                  ? `${t.accumulator.worstCaseBits} → ${t.accumulator.recommendedBits} bits`
                  : "—"}
              </Td>
            </Tr>
          );
        })}
      </tbody>
    </Table>
  );
}
