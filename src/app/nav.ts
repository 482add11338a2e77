import type { Role } from "@shared/schemas/auth";

/** One entry of the navigation; `roles` empty means every signed-in user. */
export interface NavItem {
  to: string;
  label: string;
  roles: readonly Role[];
  /** Entries with the same group render under one heading. */
  group?: string;
  /** Match the path exactly (for `/`). */
  end?: boolean;
}

/** The places that exist today; later issues append theirs here (Reviews, Releases, Templates…). */
export const NAV_ITEMS: readonly NavItem[] = [
  { to: "/", label: "Home", roles: [], end: true },
  { to: "/projects", label: "Projects", roles: [] },
  { to: "/reviews", label: "Reviews", roles: ["reviewer"] },
  { to: "/releases", label: "Releases", roles: [] },
  { to: "/templates", label: "Templates", roles: ["admin", "author"] },
  { to: "/account", label: "Account", roles: [] },
  { to: "/admin/users", label: "Users", roles: ["admin"], group: "Admin" },
  { to: "/admin/audit", label: "Audit trail", roles: ["admin"], group: "Admin" },
  { to: "/admin/mailbox", label: "Mailbox", roles: ["admin"], group: "Admin" },
];

/** The entries a user with these roles may see, in order. */
export function navFor(roles: readonly Role[]): NavItem[] {
  return NAV_ITEMS.filter((i) => i.roles.length === 0 || i.roles.some((r) => roles.includes(r)));
}
