import type { Role } from "@shared/schemas/auth";
import { ReviewsPage } from "@/features/reviews/components/reviews-page";
import { hasAnyRole } from "@/lib/roles";
import { useSessionUser } from "../shell";
import { ForbiddenRoute } from "./not-found";

const REVIEWER: readonly Role[] = ["reviewer"];

/** `/reviews`: the reviewer's queue (the server refuses other roles too). */
export function ReviewsRoute() {
  const user = useSessionUser();
  if (!hasAnyRole(user.roles, REVIEWER)) return <ForbiddenRoute />;
  return <ReviewsPage />;
}
