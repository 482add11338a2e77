/** The caution shown where wrap-around overflow is chosen for a table that is transmitted. */
export const WRAP_ON_TRANSMIT_CAUTION =
  "Wrap on a transmit table: a sample that overflows flips from full scale positive to full scale negative, " +
  "a glitch the power amplifier transmits. Saturate is the usual choice for transmit tables; if wrap is meant, " +
  "check that no sample overflows (the report counts them) and verify on a dummy load first.";

/** The caution as a note beside the overflow choice. */
export function WrapCaution({ className }: { className?: string }) {
  return (
    <p
      role="note"
      className={`rounded border border-warn-100 bg-warn-50 px-2 py-1 text-xs text-warn-800 ${className ?? ""}`}
    >
      {WRAP_ON_TRANSMIT_CAUTION}
    </p>
  );
}
