import Editor, { type OnMount } from "@monaco-editor/react";
import { useEffect, useRef, useState } from "react";
import { Link, useLocation, useNavigate } from "react-router-dom";
import { CreateTemplateSchema, type TemplateDetail, type TemplateProblem } from "@shared/exports/schemas";
import { SAMPLE_KINDS, type SampleKind } from "@shared/exports/sample-kinds";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { PageHeader } from "@/components/ui/page";
import { ErrorState, Skeleton } from "@/components/ui/states";
import { useToast } from "@/components/ui/toast";
import { ApiError } from "@/lib/api-client";
import { monaco } from "@/lib/monaco";
import { useCreateTemplate, useTemplate, useUpdateTemplate } from "../api/templates";
import { useDebouncedPreview } from "../hooks/use-debounced-preview";

const STARTER = `{%- comment -%} One line per tap: index, I code and its hex word. {%- endcomment -%}
// {{ design.name | ascii }} / {{ table.role }}: {{ table.length }} taps, W={{ spec.word_length }}, F={{ spec.fraction_length }}
{% for tap in taps -%}
{{ tap.index | pad: 4 }} {{ tap.i | pad: 8 }} {{ tap.i_hex }}
{% endfor -%}
`;

interface Draft {
  name: string;
  description: string;
  extension: string;
  body: string;
}

type FieldErrors = Partial<Record<keyof Draft, string>>;

function problemFromError(err: unknown): {
  fields: FieldErrors;
  problem: TemplateProblem | null;
  message: string;
} {
  if (!(err instanceof ApiError)) return { fields: {}, problem: null, message: String(err) };
  const fields: FieldErrors = {};
  let problem: TemplateProblem | null = null;
  if (Array.isArray(err.details))
    for (const d of err.details as {
      path?: unknown[];
      message?: string;
      line?: number | null;
      column?: number | null;
    }[]) {
      const key = d.path?.[0];
      if (key === "name" || key === "description" || key === "extension" || key === "body")
        fields[key] = d.message ?? "not valid";
      if (key === "body" && typeof d.line === "number")
        problem = { message: d.message ?? err.message, line: d.line, column: d.column ?? 1 };
    }
  return { fields, problem, message: err.message };
}

/** The Monaco source editor with the problem's line highlighted and a marker at its column. */
function SourceEditor({
  value,
  onChange,
  readOnly,
  problem,
}: {
  value: string;
  onChange: (v: string) => void;
  readOnly: boolean;
  problem: TemplateProblem | null;
}) {
  const editorRef = useRef<Parameters<OnMount>[0] | null>(null);
  const decorations = useRef<string[]>([]);
  const [mounted, setMounted] = useState(false);
  useEffect(() => {
    const editor = editorRef.current;
    const model = editor?.getModel();
    if (!editor || !model) return;
    const markers =
      problem && problem.line !== null
        ? [
            {
              severity: monaco.MarkerSeverity.Error,
              message: problem.message,
              startLineNumber: problem.line,
              startColumn: problem.column ?? 1,
              endLineNumber: problem.line,
              endColumn: model.getLineMaxColumn(Math.min(problem.line, model.getLineCount())),
            },
          ]
        : [];
    monaco.editor.setModelMarkers(model, "tapwright", markers);
    decorations.current = editor.deltaDecorations(
      decorations.current,
      markers.map((m) => ({
        range: new monaco.Range(m.startLineNumber, 1, m.startLineNumber, 1),
        options: { isWholeLine: true, className: "bg-fail-50", linesDecorationsClassName: "bg-fail-500" },
      })),
    );
  }, [problem, mounted]);
  return (
    <div
      className="h-[28rem] overflow-hidden rounded border border-paper-400 bg-white"
      data-testid="template-source"
    >
      <Editor
        language="liquid"
        value={value}
        onChange={(v) => onChange(v ?? "")}
        onMount={(editor) => {
          editorRef.current = editor;
          setMounted(true);
        }}
        loading={<Skeleton className="h-full w-full" />}
        options={{
          readOnly,
          ariaLabel: "Template source",
          minimap: { enabled: false },
          fontFamily: '"JetBrains Mono", monospace',
          fontSize: 13,
          scrollBeyondLastLine: false,
          renderLineHighlight: "none",
          tabSize: 2,
        }}
      />
    </div>
  );
}

/** The rendered sample table, or the template's problem with its position. */
function PreviewPane({
  body,
  enabled,
  onProblem,
}: {
  body: string;
  enabled: boolean;
  onProblem: (p: TemplateProblem | null) => void;
}) {
  const [sample, setSample] = useState<SampleKind>("complex");
  const state = useDebouncedPreview(body, sample, enabled);
  const result = state.status === "done" ? state.result : state.status === "loading" ? state.last : null;
  useEffect(() => {
    if (state.status === "done") onProblem(state.result.ok ? null : state.result.error);
  }, [state, onProblem]);
  return (
    <section aria-label="Preview" className="flex min-w-0 flex-col gap-2">
      <div className="flex items-center justify-between gap-2">
        <h2 className="text-sm font-semibold text-ink-800">Preview</h2>
        <label className="flex items-center gap-2 text-xs text-ink-700">
          Sample table
          <select
            className="h-7 rounded border border-paper-400 bg-white px-1.5 text-xs"
            value={sample}
            onChange={(e) => setSample(e.target.value as SampleKind)}
          >
            {SAMPLE_KINDS.map((k) => (
              <option key={k} value={k}>
                {k === "complex" ? "complex LFM, 16 taps, W=16" : "real FIR, 9 taps, W=12"}
              </option>
            ))}
          </select>
        </label>
      </div>
      {!enabled ? (
        <p className="text-sm text-ink-600">Only admins can preview templates.</p>
      ) : state.status === "failed" ? (
        <p role="alert" className="text-sm text-fail-700">
          {state.message}
        </p>
      ) : result && !result.ok ? (
        <div role="alert" className="rounded border border-fail-300 bg-fail-50 p-3 text-sm text-fail-800">
          <div className="font-medium">
            {result.error.line !== null
              ? `Line ${result.error.line}, column ${result.error.column ?? 1}`
              : "Template error"}
          </div>
          <div className="font-mono text-[13px]">{result.error.message}</div>
        </div>
      ) : (
        <>
          <pre
            aria-label="Rendered sample"
            aria-busy={state.status === "loading"}
            className="h-[28rem] overflow-auto rounded border border-paper-400 bg-paper-50 p-2 font-mono text-[12px] leading-5 text-ink-900"
          >
            {result?.text ?? ""}
          </pre>
          {result?.ok && (
            <p className="text-xs text-ink-600">
              <span className="font-mono tabular-nums">{result.bytes.toLocaleString("en")}</span> bytes
              {result.truncated && " (shown in part)"}
            </p>
          )}
        </>
      )}
    </section>
  );
}

/** One labelled single-line field of the template's metadata. */
function TextField(props: {
  label: string;
  hint?: string;
  mono?: boolean;
  value: string;
  onChange: (v: string) => void;
  readOnly: boolean;
  error: string | undefined;
}) {
  return (
    <Field label={props.label} hint={props.hint} error={props.error}>
      {({ id, describedBy, invalid }) => (
        <Input
          id={id}
          aria-describedby={describedBy}
          invalid={invalid}
          readOnly={props.readOnly}
          className={props.mono ? "font-mono" : undefined}
          value={props.value}
          onChange={(e) => props.onChange(e.target.value)}
        />
      )}
    </Field>
  );
}

function EditorForm({ initial, canEdit }: { initial: TemplateDetail | null; canEdit: boolean }) {
  const navigate = useNavigate();
  const toast = useToast();
  const location = useLocation();
  const copied = (location.state as { copyOf?: Draft } | null)?.copyOf;
  const readOnly = !canEdit || initial?.builtin === true;
  const [draft, setDraft] = useState<Draft>(
    initial
      ? {
          name: initial.name,
          description: initial.description,
          extension: initial.extension,
          body: initial.body ?? "",
        }
      : (copied ?? { name: "", description: "", extension: "txt", body: STARTER }),
  );
  const [errors, setErrors] = useState<FieldErrors>({});
  const [problem, setProblem] = useState<TemplateProblem | null>(null);
  const [saveError, setSaveError] = useState<string | null>(null);
  const create = useCreateTemplate();
  const update = useUpdateTemplate();
  const set = (k: keyof Draft) => (v: string) => setDraft((d) => ({ ...d, [k]: v }));

  async function save() {
    setSaveError(null);
    const parsed = CreateTemplateSchema.safeParse(draft);
    if (!parsed.success) {
      const fe: FieldErrors = {};
      for (const i of parsed.error.issues) fe[i.path[0] as keyof Draft] ??= i.message;
      setErrors(fe);
      return;
    }
    setErrors({});
    try {
      if (initial) {
        const t = await update.mutateAsync({
          id: initial.id,
          patch: { ...parsed.data, version: initial.version },
        });
        toast(`Saved “${t.name}” as v${t.version}`, "pass");
      } else {
        const t = await create.mutateAsync(parsed.data);
        toast(`Created “${t.name}” (v1)`, "pass");
        navigate(`/templates/${t.id}`, { replace: true });
      }
    } catch (err) {
      const p = problemFromError(err);
      setErrors(p.fields);
      if (p.problem) setProblem(p.problem);
      setSaveError(p.message);
    }
  }

  const title = initial ? initial.name : "New export template";
  return (
    <>
      <PageHeader
        title={title}
        subtitle={
          <span className="flex items-center gap-2">
            <Link to="/templates" className="text-signal-800 hover:underline">
              Templates
            </Link>
            {initial && (
              <>
                <Badge tone={initial.builtin ? "neutral" : "copper"}>
                  {initial.builtin ? "built-in" : "custom"}
                </Badge>
                <span className="font-mono">v{initial.version}</span>
                <span className="font-mono">.{initial.extension}</span>
              </>
            )}
          </span>
        }
        action={
          readOnly ? (
            canEdit && initial?.body != null ? (
              <Button
                variant="primary"
                onClick={() =>
                  navigate("/templates/new", {
                    state: { copyOf: { ...draft, name: `${draft.name} (copy)` } satisfies Draft },
                  })
                }
              >
                Copy as custom
              </Button>
            ) : undefined
          ) : (
            <Button variant="primary" busy={create.isPending || update.isPending} onClick={() => void save()}>
              {initial ? "Save new version" : "Create template"}
            </Button>
          )
        }
      />
      {initial?.kind === "binary" ? (
        <p className="text-sm text-ink-700">
          {initial.description} It is built into the server, not a text template.
        </p>
      ) : (
        <form
          className="flex flex-col gap-4"
          onSubmit={(e) => {
            e.preventDefault();
            if (!readOnly) void save();
          }}
        >
          <div className="grid grid-cols-1 gap-3 md:grid-cols-[2fr_3fr_1fr]">
            <TextField
              label="Name"
              value={draft.name}
              onChange={set("name")}
              readOnly={readOnly}
              error={errors.name}
            />
            <TextField
              label="Description"
              value={draft.description}
              onChange={set("description")}
              readOnly={readOnly}
              error={errors.description}
            />
            <TextField
              label="File extension"
              hint="without the dot"
              mono
              value={draft.extension}
              onChange={set("extension")}
              readOnly={readOnly}
              error={errors.extension}
            />
          </div>
          {saveError && (
            <p role="alert" className="text-sm text-fail-700">
              {saveError}
            </p>
          )}
          <div className="grid grid-cols-1 gap-4 xl:grid-cols-2">
            <section aria-label="Source" className="flex min-w-0 flex-col gap-2">
              <h2 className="text-sm font-semibold text-ink-800">
                Source <span className="font-normal text-ink-600">(Liquid)</span>
              </h2>
              <TemplateReference />
              <SourceEditor value={draft.body} onChange={set("body")} readOnly={readOnly} problem={problem} />
              {errors.body && !problem && <p className="text-xs text-fail-700">{errors.body}</p>}
            </section>
            <PreviewPane body={draft.body} enabled={canEdit} onProblem={setProblem} />
          </div>
        </form>
      )}
    </>
  );
}

// What a template can read and the filters it can apply (shared/exports/context.ts, server/exports/engine.ts),
// here because a web user cannot open the repository's docs.
const REFERENCE_FIELDS: ReadonlyArray<readonly [string, string]> = [
  ["project.name, project.slug", "the project"],
  ["design.name, design.kind", "the design (waveform or filter)"],
  ["version, revision, content_hash", "the release and what it was made from"],
  ["table.role, table.length, table.complex", "tx, rx or fir; tap count; complex or real"],
  ["table.sample_rate_hz, table.ident", "rate in Hz; a safe C identifier for the table"],
  ["spec.word_length, spec.fraction_length, spec.signed", "the word: W, F, two's complement or not"],
  ["spec.rounding, spec.overflow, spec.scaling, spec.gain", "how the table was quantized"],
  ["spec.min_code, spec.max_code, spec.c_type", "the integer range and a C type that holds it"],
  [
    "taps[]: index, i, q, i_hex, q_hex, i_exact, i_float",
    "each tap: codes, hex words, exact and float values",
  ],
];
const REFERENCE_FILTERS: ReadonlyArray<readonly [string, string]> = [
  ["hex, bin, twos", "a code as a W-bit hex, binary or two's-complement word"],
  ["exact", "a code as its exact decimal value"],
  ["pad: width, fill", "pad on the left (negative width: on the right)"],
  ["c_ident, vhdl_ident", "any text as a safe identifier"],
  ["c_literal", "a code as a C literal (INT32_MIN spelled safely)"],
  ["ascii", "text for a comment: ASCII only (µ becomes u)"],
];

function TemplateReference() {
  return (
    <details className="rounded border border-paper-300 bg-paper-50 px-3 py-1.5 text-xs text-ink-800">
      <summary className="cursor-pointer font-medium text-signal-800">Fields and filters</summary>
      <div className="mt-2 grid gap-3 md:grid-cols-2">
        {(
          [
            ["Fields", REFERENCE_FIELDS],
            ["Filters", REFERENCE_FILTERS],
          ] as const
        ).map(([title, rows]) => (
          <div key={title}>
            <h3 className="mb-1 font-semibold text-ink-800">{title}</h3>
            <dl className="grid grid-cols-[max-content_1fr] gap-x-3 gap-y-1">
              {rows.map(([k, v]) => (
                <div key={k} className="contents">
                  <dt className="font-mono text-[12px] text-ink-900">{k}</dt>
                  <dd className="text-ink-700">{v}</dd>
                </div>
              ))}
            </dl>
          </div>
        ))}
      </div>
    </details>
  );
}

/** /templates/new and /templates/:id: Monaco editor with a live, debounced preview on a sample table. */
export default function TemplateEditorPage({ id, canEdit }: { id: string | undefined; canEdit: boolean }) {
  const template = useTemplate(id);
  const location = useLocation();
  // key: each visit to /templates/new (e.g. "Copy as custom") starts from its own draft.
  if (id === undefined) return <EditorForm key={location.key} initial={null} canEdit={canEdit} />;
  if (template.isPending) return <Skeleton className="h-96 w-full" />;
  if (template.isError) return <ErrorState error={template.error} onRetry={() => void template.refetch()} />;
  // key: a saved new version or another template resets the form from the server's copy.
  return (
    <EditorForm
      key={`${template.data.id}@${template.data.version}`}
      initial={template.data}
      canEdit={canEdit}
    />
  );
}
