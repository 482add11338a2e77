import { lazy, Suspense, type ComponentType } from "react";
import { createBrowserRouter } from "react-router-dom";
import { PageLoading } from "@/components/ui/page-states";
import { NotFoundRoute } from "./routes/not-found";
import { Shell } from "./shell";

/**
 * A route's page, loaded when it is first visited: the first load carries only the shell, and charts (uPlot),
 * the template editor (Monaco) and the report code come with the pages that use them.
 * (docs/benchmarks.md records the first-load size.)
 */
function page<M>(load: () => Promise<M>, pick: (m: M) => ComponentType) {
  const Page = lazy(() => load().then((m) => ({ default: pick(m) })));
  return (
    <Suspense fallback={<PageLoading label="Loading the page" />}>
      <Page />
    </Suspense>
  );
}

/** Every place in the app. */
export const router = createBrowserRouter([
  {
    path: "/sign-in",
    element: page(
      () => import("./routes/sign-in"),
      (m) => m.SignInRoute,
    ),
  },
  {
    element: <Shell />,
    children: [
      {
        index: true,
        element: page(
          () => import("./routes/home"),
          (m) => m.HomeRoute,
        ),
      },
      {
        path: "projects",
        element: page(
          () => import("@/features/projects/components/projects-page"),
          (m) => m.ProjectsPage,
        ),
      },
      {
        path: "projects/:id",
        element: page(
          () => import("@/features/projects/components/project-page"),
          (m) => m.ProjectPage,
        ),
      },
      {
        path: "projects/:id/designs/new",
        element: page(
          () => import("@/features/designs/components/new-design-page"),
          (m) => m.NewDesignPage,
        ),
      },
      {
        path: "designs/:id",
        element: page(
          () => import("@/features/designs/components/design-page"),
          (m) => m.DesignPage,
        ),
      },
      {
        path: "revisions/:id",
        element: page(
          () => import("@/features/revisions/components/revision-page"),
          (m) => m.RevisionPage,
        ),
      },
      {
        path: "revisions/:id/report",
        element: page(
          () => import("@/features/analysis/components/report-page"),
          (m) => m.ReportPage,
        ),
      },
      {
        path: "reviews",
        element: page(
          () => import("./routes/reviews"),
          (m) => m.ReviewsRoute,
        ),
      },
      {
        path: "releases",
        element: page(
          () => import("@/features/releases/components/releases-page"),
          (m) => m.ReleasesPage,
        ),
      },
      {
        path: "releases/:id",
        element: page(
          () => import("@/features/releases/components/release-page"),
          (m) => m.ReleasePage,
        ),
      },
      {
        path: "templates",
        element: page(
          () => import("@/features/templates/components/template-routes"),
          (m) => m.TemplatesRoute,
        ),
      },
      {
        path: "templates/new",
        element: page(
          () => import("@/features/templates/components/template-routes"),
          (m) => m.TemplateEditorRoute,
        ),
      },
      {
        path: "templates/:id",
        element: page(
          () => import("@/features/templates/components/template-routes"),
          (m) => m.TemplateEditorRoute,
        ),
      },
      {
        path: "account",
        element: page(
          () => import("./routes/pages"),
          (m) => m.AccountRoute,
        ),
      },
      {
        path: "admin/users",
        element: page(
          () => import("./routes/pages"),
          (m) => m.AdminUsersRoute,
        ),
      },
      // Admin only: the server answers 403 to anyone else and the pages show that error.
      {
        path: "admin/audit",
        element: page(
          () => import("@/features/audit/components/audit-page"),
          (m) => m.AuditPage,
        ),
      },
      {
        path: "admin/mailbox",
        element: page(
          () => import("@/features/mailbox/components/mailbox-page"),
          (m) => m.MailboxPage,
        ),
      },
      {
        path: "admin/mailbox/:id",
        element: page(
          () => import("@/features/mailbox/components/mailbox-page"),
          (m) => m.MailboxPage,
        ),
      },
      { path: "*", element: <NotFoundRoute /> },
    ],
  },
]);
