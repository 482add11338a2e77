import { useRef, useState, type DragEvent } from "react";
import type { Upload } from "@shared/schemas/designs";
import { CopyButton } from "@/components/ui/copy-button";
import { ApiError } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { formatCount } from "@/lib/format";
import { useUploadFile } from "../api/upload-file";

const FORMAT_NAMES: Record<Upload["format"], string> = {
  text: "Text, one value or I Q per line",
  csv: "CSV",
  tsv: "TSV",
  "complex-text": "Complex text (a+bj)",
  json: "JSON array",
};

/** Where the parser stopped, from a 400 answer's details `{ line, column }`. */
function position(err: unknown): { line: number; column: number } | undefined {
  if (!(err instanceof ApiError) || typeof err.details !== "object" || err.details === null) return undefined;
  const { line, column } = err.details as { line?: unknown; column?: unknown };
  return typeof line === "number" && typeof column === "number" ? { line, column } : undefined;
}

/**
 * Drop zone and file input: the file goes to the server at once, which keeps it byte for byte and answers with
 * what it read (format, count, complex, SHA-256) or where it stopped (line, column).
 */
export function UploadField({
  projectId,
  upload,
  onUploaded,
  error,
}: {
  projectId: number;
  upload: Upload | null;
  onUploaded: (u: Upload | null) => void;
  error?: string;
}) {
  const send = useUploadFile(projectId);
  const input = useRef<HTMLInputElement>(null);
  const [dragging, setDragging] = useState(false);
  const take = (file: File | undefined) => {
    if (!file) return;
    onUploaded(null);
    send.mutate(file, { onSuccess: (u) => onUploaded(u) });
  };
  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setDragging(false);
    take(e.dataTransfer.files[0]);
  };
  const where = position(send.error);
  return (
    <div className="flex flex-col gap-2">
      <div
        onDragOver={(e) => {
          e.preventDefault();
          setDragging(true);
        }}
        onDragLeave={() => setDragging(false)}
        onDrop={onDrop}
        className={cn(
          "flex flex-col items-start gap-1 rounded border border-dashed px-4 py-4",
          dragging
            ? "border-signal-600 bg-signal-50"
            : error
              ? "border-fail-600 bg-paper-50"
              : "border-paper-400 bg-paper-50",
        )}
      >
        <label htmlFor="coefficient-file" className="text-sm font-medium text-ink-800">
          Coefficient file
        </label>
        <p className="text-xs text-ink-600" id="coefficient-file-hint">
          Drop a file here or choose one: one value (or I and Q) per line, CSV/TSV with or without a header,
          a+bj complex text, or a JSON array. Up to 32 MiB and 4 194 304 values. Kept byte for byte.
        </p>
        <input
          ref={input}
          id="coefficient-file"
          type="file"
          accept=".txt,.csv,.tsv,.json,.dat,text/plain,text/csv,application/json"
          aria-describedby="coefficient-file-hint"
          className="mt-1 text-sm text-ink-800 file:mr-3 file:rounded file:border file:border-paper-400 file:bg-white file:px-2.5 file:py-1 file:text-sm file:text-ink-800"
          onChange={(e) => take(e.target.files?.[0])}
        />
        {send.isPending && (
          <p role="status" className="text-sm text-ink-700">
            Reading the file…
          </p>
        )}
      </div>
      {send.isError && (
        <div
          role="alert"
          className="rounded border border-fail-100 bg-fail-50 px-3 py-2 text-sm text-fail-800"
        >
          <p className="font-medium">The file was not accepted; nothing was stored.</p>
          <p className="font-mono text-[13px]">{send.error.message}</p>
          {where && (
            <p className="text-xs">
              Line {where.line}, column {where.column}
            </p>
          )}
        </div>
      )}
      {!send.isError && error && (
        <p role="alert" className="text-xs text-fail-700">
          {error}
        </p>
      )}
      {upload && (
        <dl
          aria-label="Uploaded file"
          className="grid grid-cols-[max-content_1fr] items-center gap-x-4 gap-y-1 rounded border border-paper-300 bg-white px-3 py-2 text-sm"
        >
          <dt className="text-ink-600">File</dt>
          <dd className="font-mono text-[13px]">{upload.fileName}</dd>
          <dt className="text-ink-600">Format</dt>
          <dd>{FORMAT_NAMES[upload.format]}</dd>
          <dt className="text-ink-600">Values</dt>
          <dd className="font-mono text-[13px]" data-testid="upload-count">
            {formatCount(upload.count)} {upload.complex ? "complex (I, Q)" : "real"}
          </dd>
          <dt className="text-ink-600">SHA-256</dt>
          <dd className="flex items-center gap-2">
            <code className="font-mono text-[13px]" title={upload.sha256}>
              {upload.sha256.slice(0, 12)}…
            </code>
            <CopyButton value={upload.sha256} label="Copy SHA-256" />
          </dd>
        </dl>
      )}
    </div>
  );
}
