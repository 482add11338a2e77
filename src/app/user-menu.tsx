import { useEffect, useRef, useState } from "react";
import { Link, useNavigate } from "react-router-dom";
import type { SessionUser } from "@shared/schemas/auth";
import { useSignOut } from "@/features/auth/api/sign-out";
import { cn } from "@/lib/cn";
import { ROLE_LABELS } from "@/lib/roles";

/** The signed-in user's name and roles; opens a menu with Account and Sign out. Esc or a click outside closes it. */
export function UserMenu({ user }: { user: SessionUser }) {
  const [open, setOpen] = useState(false);
  const ref = useRef<HTMLDivElement>(null);
  const signOut = useSignOut();
  const navigate = useNavigate();
  useEffect(() => {
    if (!open) return;
    const onDown = (e: MouseEvent) => {
      if (!ref.current?.contains(e.target as Node)) setOpen(false);
    };
    const onKey = (e: KeyboardEvent) => {
      if (e.key === "Escape") setOpen(false);
    };
    document.addEventListener("mousedown", onDown);
    document.addEventListener("keydown", onKey);
    return () => {
      document.removeEventListener("mousedown", onDown);
      document.removeEventListener("keydown", onKey);
    };
  }, [open]);
  const initials = user.displayName
    .split(/\s+/)
    .map((w) => w[0] ?? "")
    .join("")
    .slice(0, 2)
    .toUpperCase();
  return (
    <div ref={ref} className="relative">
      <button
        type="button"
        aria-haspopup="menu"
        aria-expanded={open}
        onClick={() => setOpen((o) => !o)}
        className="flex w-full items-center gap-2.5 rounded px-2 py-1.5 text-left hover:bg-ink-800"
      >
        <span
          aria-hidden="true"
          className="flex h-7 w-7 shrink-0 items-center justify-center rounded-full bg-copper-300 text-xs font-semibold text-ink-950"
        >
          {initials}
        </span>
        <span className="min-w-0">
          <span className="block truncate text-sm font-medium text-ink-50">{user.displayName}</span>
          <span className="block truncate text-xs text-ink-300">
            {user.roles.map((r) => ROLE_LABELS[r]).join(" · ")}
          </span>
        </span>
      </button>
      {open && (
        <div
          role="menu"
          aria-label="User menu"
          className="absolute bottom-full left-0 mb-1 w-full overflow-hidden rounded border border-paper-300 bg-paper-50 py-1 text-sm text-ink-900 shadow-lg"
        >
          <div className="border-b border-paper-200 px-3 py-1.5 text-xs text-ink-600">
            Signed in as <span className="font-mono text-ink-800">{user.username}</span>
          </div>
          <Link
            role="menuitem"
            to="/account"
            onClick={() => setOpen(false)}
            className="block px-3 py-1.5 hover:bg-paper-200"
          >
            Account
          </Link>
          <button
            type="button"
            role="menuitem"
            disabled={signOut.isPending}
            onClick={() =>
              signOut.mutate(undefined, {
                onSettled: () => navigate("/sign-in", { replace: true }),
              })
            }
            className={cn(
              "block w-full px-3 py-1.5 text-left hover:bg-paper-200",
              signOut.isPending && "opacity-60",
            )}
          >
            Sign out
          </button>
        </div>
      )}
    </div>
  );
}
