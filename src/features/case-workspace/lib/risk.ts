// The worst surface state a case's readings show, for the summary above the workspace's tabs.
import type { EvaluationResponse } from "@/lib/contracts";
import type { SurfaceState } from "@/lib/domain";

/** Worst first, as the queue's risk column ranks them. */
const ORDER: readonly SurfaceState[] = ["condensing", "mould-risk", "borderline", "dry"];

/** The worst state over every room and surface, or null when no surface has been worked out. */
export function worstSurfaceState(evaluation: Pick<EvaluationResponse, "rooms">): SurfaceState | null {
  let worst: number | null = null;
  for (const room of evaluation.rooms)
    for (const surface of room.surfaces) {
      const rank = ORDER.indexOf(surface.result.surface.state);
      if (rank >= 0 && (worst === null || rank < worst)) worst = rank;
    }
  return worst === null ? null : ORDER[worst]!;
}
