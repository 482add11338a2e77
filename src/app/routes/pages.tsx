import type { Role } from "@shared/schemas/auth";
import { AccountPage } from "@/features/account/components/account-page";
import { UsersPage } from "@/features/admin-users/components/users-page";
import { TokensSection } from "@/features/tokens/components/tokens-section";
import { hasAnyRole } from "@/lib/roles";
import { useSessionUser } from "../shell";
import { ForbiddenRoute } from "./not-found";

/** `/account`. */
export function AccountRoute() {
  const user = useSessionUser();
  // On a temporary password the server refuses everything but the change itself, tokens included.
  return <AccountPage user={user} tokens={user.mustChangePassword ? undefined : <TokensSection />} />;
}

const ADMIN: readonly Role[] = ["admin"];

/** `/admin/users` (admin only; the server refuses others too). */
export function AdminUsersRoute() {
  const user = useSessionUser();
  if (!hasAnyRole(user.roles, ADMIN)) return <ForbiddenRoute />;
  return <UsersPage currentUserId={user.id} />;
}
