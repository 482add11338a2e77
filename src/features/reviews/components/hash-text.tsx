import { CopyButton } from "@/components/ui/copy-button";
import { shortHash } from "../lib/figures";

/** A hash shortened to 12 hex digits, whole in the tooltip, with a button that copies all of it. */
export function HashText({ value, label }: { value: string; label: string }) {
  return (
    <span className="inline-flex items-center gap-1.5 align-middle">
      <span className="font-mono text-[13px]" title={value}>
        {shortHash(value)}
      </span>
      <CopyButton value={value} label={`Copy ${label}`} />
    </span>
  );
}
