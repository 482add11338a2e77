import type { UseFormRegisterReturn } from "react-hook-form";
import { ROLES } from "@shared/schemas/auth";
import { ROLE_LABELS } from "@/lib/roles";

/** One checkbox per role inside a fieldset, registered as an array field. */
export function RoleCheckboxes({
  registration,
  error,
}: {
  registration: UseFormRegisterReturn;
  error?: string | undefined;
}) {
  return (
    <fieldset className="flex flex-col gap-1" aria-describedby={error ? "roles-error" : undefined}>
      <legend className="mb-1 text-xs font-medium text-ink-700">Roles</legend>
      <div className="flex flex-wrap gap-x-4 gap-y-1">
        {ROLES.map((r) => (
          <label key={r} className="inline-flex items-center gap-1.5 text-sm text-ink-800">
            <input type="checkbox" value={r} className="h-3.5 w-3.5 accent-signal-700" {...registration} />
            {ROLE_LABELS[r]}
          </label>
        ))}
      </div>
      {error && (
        <p id="roles-error" role="alert" className="text-xs text-fail-700">
          {error}
        </p>
      )}
    </fieldset>
  );
}
