import { useRef } from "react";
import { useWatch, type Control } from "react-hook-form";
import type { DesignFormValues } from "../lib/form-values";
import { deriveFigures } from "../lib/derived-figures";

/** Samples, BT, range resolution, chips, FIR order and β, recomputed as the author types; warnings below. */
export function DerivedFigures({ control }: { control: Control<DesignFormValues> }) {
  const values = useWatch({ control }) as DesignFormValues;
  const derived = deriveFigures(values);
  // While a field is being fixed the panel keeps the last figures it could compute, marked as such,
  // instead of vanishing under the author's eyes.
  const last = useRef<typeof derived.figures>([]);
  const stale = derived.figures.length === 0 && last.current.length > 0 && values.source !== "upload";
  if (derived.figures.length > 0) last.current = derived.figures;
  const figures = stale ? last.current : derived.figures;
  const { warnings } = derived;
  if (figures.length === 0 && warnings.length === 0) return null;
  return (
    <section aria-label="Derived figures" className="rounded border border-paper-300 bg-white px-4 py-3">
      <h2 className="mb-2 text-sm font-semibold text-ink-800">Derived figures</h2>
      {stale && (
        <p className="mb-2 text-xs text-warn-800">
          From the last valid values: fix the marked field to update them.
        </p>
      )}
      <dl className="grid grid-cols-[1fr_max-content] gap-x-4 gap-y-1 text-sm">
        {figures.map((f) => (
          <div key={f.label} className="contents">
            <dt className="text-ink-600">{f.label}</dt>
            <dd className="text-right font-mono text-[13px] text-ink-900">{f.value}</dd>
          </div>
        ))}
      </dl>
      {warnings.length > 0 && (
        <ul className="mt-3 flex flex-col gap-1" aria-label="Warnings">
          {warnings.map((w) => (
            <li key={w} className="rounded border border-warn-100 bg-warn-50 px-2 py-1 text-xs text-warn-800">
              {w}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
