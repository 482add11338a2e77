import { Fragment } from "react";
import { Link, Navigate, NavLink, Outlet, useLocation, useOutletContext } from "react-router-dom";
import type { SessionUser } from "@shared/schemas/auth";
import { Wordmark } from "@/components/brand/mark";
import { Skeleton } from "@/components/ui/states";
import { useMe } from "@/features/auth/api/get-me";
import { cn } from "@/lib/cn";
import { navFor } from "./nav";
import { useGlobalShortcuts } from "./shortcuts";
import { UserMenu } from "./user-menu";

/** The signed-in user, for pages inside the shell. */
export function useSessionUser(): SessionUser {
  return useOutletContext<SessionUser>();
}

function Navigation({ user }: { user: SessionUser }) {
  const items = navFor(user.roles);
  let lastGroup: string | undefined;
  return (
    <nav aria-label="Main" className="flex flex-col gap-0.5 px-2">
      {items.map((item) => {
        const heading = item.group && item.group !== lastGroup ? item.group : undefined;
        lastGroup = item.group;
        return (
          <Fragment key={item.to}>
            {heading && (
              <div className="mt-4 mb-1 px-2 text-[11px] font-semibold tracking-wider text-ink-300 uppercase">
                {heading}
              </div>
            )}
            <NavLink
              to={item.to}
              end={item.end}
              className={({ isActive }) =>
                cn(
                  "rounded px-2 py-1.5 text-sm",
                  isActive
                    ? "bg-ink-800 font-medium text-white shadow-[inset_2px_0_0] shadow-signal-300"
                    : "text-ink-200 hover:bg-ink-800 hover:text-white",
                )
              }
            >
              {item.label}
            </NavLink>
          </Fragment>
        );
      })}
    </nav>
  );
}

function MustChangeBanner() {
  return (
    <div role="status" className="border-b border-warn-100 bg-warn-50 px-6 py-2 text-sm text-warn-800">
      You are signed in with a temporary password.{" "}
      <Link to="/account" className="font-medium underline">
        Change it now
      </Link>
      .
    </div>
  );
}

/** The signed-in frame: navigation by role, user menu, shortcuts, and the page. */
export function Shell() {
  const me = useMe();
  const location = useLocation();
  useGlobalShortcuts();
  if (!me.data) {
    // 401 is handled by the QueryCache (redirect to sign-in); anything else shows a quiet frame while loading.
    return (
      <div role="status" aria-label="Loading" className="flex h-screen">
        <div className="w-52 bg-ink-900" />
        <div className="flex-1 p-6">
          <Skeleton className="mb-3 h-6 w-64" />
          <Skeleton className="h-40 w-full" />
          {me.isError && <p className="mt-4 text-sm text-fail-700">{me.error.message}</p>}
        </div>
      </div>
    );
  }
  const user = me.data;
  // The server answers nothing else until a temporary password is changed: go where that is done.
  if (user.mustChangePassword && location.pathname !== "/account") return <Navigate to="/account" replace />;
  return (
    <div className="flex min-h-screen">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-50 focus:rounded focus:bg-paper-50 focus:px-3 focus:py-1.5"
      >
        Skip to content
      </a>
      {/* The outer column paints the full page height; the inner sidebar stays in view while the page scrolls. */}
      <div className="w-52 shrink-0 bg-ink-900">
        <aside className="sticky top-0 flex h-screen w-52 flex-col text-ink-50">
          <Link to="/" className="flex h-12 items-center px-4 text-white" aria-label="Tapwright home">
            <Wordmark />
          </Link>
          <div className="flex-1 overflow-y-auto pt-2">
            <Navigation user={user} />
          </div>
          <div className="border-t border-ink-800 px-3 py-2 text-[11px] text-ink-300">
            <kbd className="rounded border border-ink-700 px-1 font-mono">/</kbd> search ·{" "}
            <kbd className="rounded border border-ink-700 px-1 font-mono">g</kbd>{" "}
            <kbd className="rounded border border-ink-700 px-1 font-mono">p</kbd> projects
          </div>
          <div className="border-t border-ink-800 p-2">
            <UserMenu user={user} />
          </div>
        </aside>
      </div>
      <div className="flex min-w-0 flex-1 flex-col">
        {user.mustChangePassword && <MustChangeBanner />}
        <main id="main" className="mx-auto w-full max-w-6xl flex-1 px-6 py-5">
          <Outlet context={user} />
        </main>
      </div>
    </div>
  );
}
