import type { Role } from "@shared/schemas/auth";
import { AccountPage } from "@/features/account/components/account-page";
import { UsersPage } from "@/features/admin-users/components/users-page";
import { TokensSection } from "@/features/tokens/components/tokens-section";
import { hasAnyRole } from "@/lib/roles";
import { useSessionUser } from "../shell";
import { ForbiddenRoute } from "./not-found";

/** `/account`. */
export function AccountRoute() {
  return <AccountPage user={useSessionUser()} tokens={<TokensSection />} />;
}

const ADMIN: readonly Role[] = ["admin"];

/** `/admin/users` (admin only; the server refuses others too). */
export function AdminUsersRoute() {
  const user = useSessionUser();
  if (!hasAnyRole(user.roles, ADMIN)) return <ForbiddenRoute />;
  return <UsersPage currentUserId={user.id} />;
}
