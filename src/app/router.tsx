import { createBrowserRouter } from "react-router-dom";
import { ReportPage } from "@/features/analysis/components/report-page";
import { DesignPage } from "@/features/designs/components/design-page";
import { RevisionPage } from "@/features/revisions/components/revision-page";
import { NewDesignPage } from "@/features/designs/components/new-design-page";
import { ProjectPage } from "@/features/projects/components/project-page";
import { ProjectsPage } from "@/features/projects/components/projects-page";
import { AuditPage } from "@/features/audit/components/audit-page";
import { MailboxPage } from "@/features/mailbox/components/mailbox-page";
import { TemplateEditorRoute, TemplatesRoute } from "@/features/templates/components/template-routes";
import { ReleasePage } from "@/features/releases/components/release-page";
import { ReleasesPage } from "@/features/releases/components/releases-page";
import { NotFoundRoute } from "./routes/not-found";
import { ReviewsRoute } from "./routes/reviews";
import { AccountRoute, AdminUsersRoute, HomeRoute } from "./routes/pages";
import { SignInRoute } from "./routes/sign-in";
import { Shell } from "./shell";

/** Every place in the app. */
export const router = createBrowserRouter([
  { path: "/sign-in", element: <SignInRoute /> },
  {
    element: <Shell />,
    children: [
      { index: true, element: <HomeRoute /> },
      { path: "projects", element: <ProjectsPage /> },
      { path: "projects/:id", element: <ProjectPage /> },
      { path: "projects/:id/designs/new", element: <NewDesignPage /> },
      { path: "designs/:id", element: <DesignPage /> },
      { path: "revisions/:id", element: <RevisionPage /> },
      { path: "revisions/:id/report", element: <ReportPage /> },
      { path: "reviews", element: <ReviewsRoute /> },
      { path: "releases", element: <ReleasesPage /> },
      { path: "releases/:id", element: <ReleasePage /> },
      { path: "templates", element: <TemplatesRoute /> },
      { path: "templates/new", element: <TemplateEditorRoute /> },
      { path: "templates/:id", element: <TemplateEditorRoute /> },
      { path: "account", element: <AccountRoute /> },
      { path: "admin/users", element: <AdminUsersRoute /> },
      // Admin only: the server answers 403 to anyone else and the pages show that error.
      { path: "admin/audit", element: <AuditPage /> },
      { path: "admin/mailbox", element: <MailboxPage /> },
      { path: "admin/mailbox/:id", element: <MailboxPage /> },
      { path: "*", element: <NotFoundRoute /> },
    ],
  },
]);
