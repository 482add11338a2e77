import { lazy, Suspense } from "react";
import { useParams } from "react-router-dom";
import type { Role } from "@shared/schemas/auth";
import { Skeleton } from "@/components/ui/states";
import { useMe } from "@/features/auth/api/get-me";
import { hasAnyRole } from "@/lib/roles";
import { TemplatesPage } from "./templates-page";

// Monaco (about 4 MB) loads only when an editor page opens.
const TemplateEditorPage = lazy(() => import("./template-editor-page"));

const EDITORS: readonly Role[] = ["admin"];

function useCanEdit(): boolean {
  const me = useMe();
  return hasAnyRole(me.data?.roles ?? [], EDITORS) && me.data !== undefined;
}

/** `/templates`: admins edit, authors read; the server refuses anyone else. */
export function TemplatesRoute() {
  return <TemplatesPage canEdit={useCanEdit()} />;
}

/** `/templates/new` and `/templates/:id`. */
export function TemplateEditorRoute() {
  const { id } = useParams();
  const canEdit = useCanEdit();
  return (
    <Suspense fallback={<Skeleton className="h-96 w-full" />}>
      <TemplateEditorPage id={id} canEdit={canEdit} />
    </Suspense>
  );
}
