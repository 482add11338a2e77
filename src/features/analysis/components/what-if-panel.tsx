import { useQueryClient } from "@tanstack/react-query";
import { useMemo, useState } from "react";
import type { AnalysisReport } from "@shared/dsp/analysis";
import type { AnalysisStatus } from "@shared/schemas/analyses";
import type { RevisionDetail, TableRole } from "@shared/schemas/designs";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { useToast } from "@/components/ui/toast";
import { useUpdateRevision } from "@/features/revisions/api/update-revision";
import { analysisKeys } from "../api/keys";
import { formatDiff, formatMetric } from "../lib/format-metric";
import {
  applyChange,
  changesContent,
  compareFigures,
  currentChange,
  mainFigures,
  tableRolesOf,
  type WhatIfChange,
} from "../lib/what-if";
import {
  DEFAULT_WINDOW_PARAMS,
  ROUNDING_LABELS,
  WINDOW_LABELS,
  windowOf,
  type WindowKind,
} from "../lib/what-if-options";
import { useWhatIf } from "../hooks/use-what-if";

const SELECT =
  "h-8 w-full rounded border border-paper-400 bg-white px-2 text-sm text-ink-900 focus:border-signal-600 focus:outline-none focus-visible:outline-2 focus-visible:outline-signal-500";

/**
 * What-if on a draft: change one table's W, F, rounding, overflow or the receive window and see the main
 * figures from the DSP core (in a Web Worker) beside the saved report's, without saving; "Apply to draft"
 * saves the change as the draft's content.
 */
export function WhatIfPanel({
  revisionId,
  detail,
  saved,
}: {
  revisionId: number;
  detail: RevisionDetail;
  saved: AnalysisStatus["report"];
}) {
  const content = detail.content;
  const roles = tableRolesOf(content);
  const [change, setChange] = useState<WhatIfChange>(() => currentChange(content, roles[0]!));
  const preview = useMemo(() => applyChange(content, change), [content, change]);
  const state = useWhatIf(revisionId, detail.tables, preview);
  const savedFigures = useMemo(
    () => (saved ? mainFigures(saved as unknown as AnalysisReport) : null),
    [saved],
  );
  const rows = compareFigures(savedFigures, state.result?.figures ?? null);
  const update = useUpdateRevision(revisionId);
  const qc = useQueryClient();
  const toast = useToast();
  const dirty = changesContent(content, change);

  const setFp = (patch: Partial<WhatIfChange["fixedPoint"]>) =>
    setChange((c) => ({ ...c, fixedPoint: { ...c.fixedPoint, ...patch } }));
  const setW = (w: number) => {
    // Keep the integer bits W − F, as the bit-width sweep does, so only the resolution changes.
    setFp({
      wordLength: w,
      fractionLength: change.fixedPoint.fractionLength + (w - change.fixedPoint.wordLength),
    });
  };
  const windowKind = change.rxWindow?.kind;

  return (
    <section
      aria-labelledby="what-if-title"
      className="rounded border border-paper-300 bg-paper-50 p-3"
      data-testid="what-if-panel"
    >
      <div className="mb-3 flex flex-wrap items-baseline justify-between gap-2">
        <h3 id="what-if-title" className="text-sm font-semibold text-ink-800">
          What if… <span className="font-normal text-ink-600">(not saved until you apply it)</span>
        </h3>
        <span className="text-xs text-ink-600" aria-live="polite">
          {state.status === "loading-tables" && "Loading the tables…"}
          {state.status === "running" && "Computing…"}
          {state.status === "done" && state.result && (
            <>
              Computed in <span className="font-mono">{Math.round(state.result.elapsedMs)} ms</span> (no
              sweep, no Doppler cut)
            </>
          )}
        </span>
      </div>
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-6">
        {roles.length > 1 && (
          <Field label="Table">
            {({ id }) => (
              <select
                id={id}
                className={SELECT}
                value={change.table}
                onChange={(e) => setChange(currentChange(content, e.target.value as TableRole))}
              >
                {roles.map((r) => (
                  <option key={r} value={r}>
                    {r === "tx" ? "tx (transmit)" : "rx (receive)"}
                  </option>
                ))}
              </select>
            )}
          </Field>
        )}
        <NumberField
          label="Word length W (bits)"
          value={change.fixedPoint.wordLength}
          min={2}
          max={32}
          step={1}
          onValue={setW}
        />
        <NumberField
          label="Fraction length F (bits)"
          value={change.fixedPoint.fractionLength}
          min={-64}
          max={96}
          step={1}
          onValue={(f) => setFp({ fractionLength: f })}
        />
        <Field label="Rounding">
          {({ id }) => (
            <select
              id={id}
              className={SELECT}
              value={change.fixedPoint.rounding}
              onChange={(e) => setFp({ rounding: e.target.value as WhatIfChange["fixedPoint"]["rounding"] })}
            >
              {Object.entries(ROUNDING_LABELS).map(([k, label]) => (
                <option key={k} value={k}>
                  {label}
                </option>
              ))}
            </select>
          )}
        </Field>
        <Field label="Overflow">
          {({ id }) => (
            <select
              id={id}
              className={SELECT}
              value={change.fixedPoint.overflow}
              onChange={(e) => setFp({ overflow: e.target.value as "saturate" | "wrap" })}
            >
              <option value="saturate">saturate</option>
              <option value="wrap">wrap</option>
            </select>
          )}
        </Field>
        {windowKind && (
          <Field label="Receive window">
            {({ id }) => (
              <select
                id={id}
                className={SELECT}
                value={windowKind}
                onChange={(e) =>
                  setChange((c) => ({
                    ...c,
                    rxWindow: windowOf(e.target.value as WindowKind, DEFAULT_WINDOW_PARAMS),
                  }))
                }
              >
                {Object.entries(WINDOW_LABELS).map(([k, label]) => (
                  <option key={k} value={k}>
                    {label}
                  </option>
                ))}
              </select>
            )}
          </Field>
        )}
      </div>
      {change.rxWindow && (
        <WindowParams window={change.rxWindow} onChange={(w) => setChange((c) => ({ ...c, rxWindow: w }))} />
      )}

      <div className="mt-3">
        {state.status === "error" && (
          <p role="alert" className="mb-2 text-sm text-fail-700">
            {state.error}
          </p>
        )}
        <Table label="What-if figures">
          <thead>
            <tr>
              <Th>Figure (fixed point)</Th>
              <Th numeric>Saved report</Th>
              <Th numeric>What-if</Th>
              <Th numeric>Difference</Th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <Tr key={r.key}>
                <Td>{r.label}</Td>
                <Td numeric>
                  {formatMetric(r.saved, "dB", r.key === "coefficientSqnrDb" && savedFigures ? "exact" : "—")}
                </Td>
                <Td numeric data-testid={`what-if-${r.key}`}>
                  {formatMetric(
                    r.preview,
                    "dB",
                    r.key === "coefficientSqnrDb" && state.result ? "exact" : "—",
                  )}
                </Td>
                <Td numeric>{formatDiff(r.diff, "dB")}</Td>
              </Tr>
            ))}
          </tbody>
        </Table>
      </div>
      <div className="mt-3 flex flex-wrap items-center justify-between gap-2">
        <div className="flex items-center gap-2 text-sm text-ink-700">
          {state.result && (
            <>
              <Badge tone={state.result.figures.pass ? "pass" : "fail"}>
                {state.result.figures.pass ? "Limits pass" : "Limits fail"}
              </Badge>
              <span>
                overflowed values: <span className="font-mono">{state.result.figures.overflowCount}</span>
              </span>
            </>
          )}
        </div>
        <div className="flex gap-2">
          <Button
            size="sm"
            variant="ghost"
            disabled={!dirty}
            onClick={() => setChange(currentChange(content, change.table))}
          >
            Reset
          </Button>
          <Button
            size="sm"
            disabled={!dirty}
            busy={update.isPending}
            onClick={() =>
              update.mutate(applyChange(content, change), {
                onSuccess: () => {
                  void qc.invalidateQueries({ queryKey: analysisKeys.status(revisionId) });
                  toast("Saved to the draft. Run the analysis again for the full report.", "pass");
                },
              })
            }
          >
            Apply to draft
          </Button>
        </div>
      </div>
      {update.isError && (
        <p role="alert" className="mt-2 text-sm text-fail-700">
          {update.error.message}
        </p>
      )}
    </section>
  );
}

/** A number input that reports only values inside [min, max] (integers when `step` is 1). */
function NumberField({
  label,
  value,
  min,
  max,
  step,
  onValue,
}: {
  label: string;
  value: number;
  min: number;
  max: number;
  step: number;
  onValue: (v: number) => void;
}) {
  return (
    <Field label={label}>
      {({ id }) => (
        <Input
          id={id}
          type="number"
          step={step}
          min={min}
          max={max}
          className="font-mono"
          value={value}
          onChange={(e) => {
            const v = Number(e.target.value);
            if (
              e.target.value !== "" &&
              Number.isFinite(v) &&
              v >= min &&
              v <= max &&
              (step !== 1 || Number.isInteger(v))
            )
              onValue(v);
          }}
        />
      )}
    </Field>
  );
}

/** The window's own parameters (Kaiser β, Chebyshev attenuation, Taylor n̄ and sidelobe level). */
function WindowParams({
  window: w,
  onChange,
}: {
  window: NonNullable<WhatIfChange["rxWindow"]>;
  onChange: (w: NonNullable<WhatIfChange["rxWindow"]>) => void;
}) {
  let fields;
  if (w.kind === "kaiser")
    fields = (
      <NumberField
        label="Kaiser β"
        value={w.beta}
        min={0}
        max={100}
        step={0.5}
        onValue={(beta) => onChange({ ...w, beta })}
      />
    );
  else if (w.kind === "chebyshev")
    fields = (
      <NumberField
        label="Sidelobe attenuation (dB)"
        value={w.attenuationDb}
        min={13}
        max={300}
        step={1}
        onValue={(attenuationDb) => onChange({ ...w, attenuationDb })}
      />
    );
  else if (w.kind === "taylor")
    fields = (
      <>
        <NumberField
          label="Taylor n̄"
          value={w.nbar}
          min={1}
          max={100}
          step={1}
          onValue={(nbar) => onChange({ ...w, nbar })}
        />
        <NumberField
          label="Taylor sidelobe level (dB)"
          value={w.sidelobeDb}
          min={-300}
          max={-13}
          step={1}
          onValue={(sidelobeDb) => onChange({ ...w, sidelobeDb })}
        />
      </>
    );
  else return null;
  return <div className="mt-3 grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-6">{fields}</div>;
}
