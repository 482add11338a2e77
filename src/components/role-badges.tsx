import type { Role } from "@shared/schemas/auth";
import { Badge } from "@/components/ui/badge";
import { ROLE_LABELS } from "@/lib/roles";

const TONE: Record<Role, "copper" | "signal" | "neutral" | "warn"> = {
  admin: "copper",
  author: "signal",
  reviewer: "neutral",
  firmware: "neutral",
};

/** A user's roles as small badges, in the fixed order admin, author, reviewer, firmware. */
export function RoleBadges({ roles }: { roles: readonly Role[] }) {
  const order: Role[] = ["admin", "author", "reviewer", "firmware"];
  return (
    <span className="inline-flex flex-wrap gap-1">
      {order
        .filter((r) => roles.includes(r))
        .map((r) => (
          <Badge key={r} tone={TONE[r]}>
            {ROLE_LABELS[r]}
          </Badge>
        ))}
    </span>
  );
}
