import type { Release } from "@shared/schemas/releases";
import { Badge } from "@/components/ui/badge";

/** "active" or "withdrawn", as a badge. */
export function ReleaseStatusBadge({ release }: { release: Pick<Release, "withdrawn"> }) {
  return release.withdrawn ? <Badge tone="fail">withdrawn</Badge> : <Badge tone="pass">active</Badge>;
}
