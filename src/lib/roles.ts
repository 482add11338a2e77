import type { Role } from "@shared/schemas/auth";

/** Display names for roles, as the team says them. */
export const ROLE_LABELS: Record<Role, string> = {
  admin: "Admin",
  author: "Author",
  reviewer: "Reviewer",
  firmware: "Firmware",
};

/** True when the user holds any of `wanted` (an empty list means anyone signed in). */
export function hasAnyRole(roles: readonly Role[], wanted: readonly Role[]): boolean {
  return wanted.length === 0 || wanted.some((r) => roles.includes(r));
}
