import { showLength } from "@/lib/format/quantities";
import { JUDGING_DEFAULTS } from "../judge";
import type { Rule } from "./types";

/**
 * Measured seating larger than the plan's anchor set by more than the project's threshold (1/8 in
 * by default, common practice): wedges that drew in farther than planned leave less force.
 */
export const seatingExcess: Rule = ({ input, judgement }) => {
  const p = input.project;
  const threshold = p.seatingExcessMm ?? JUDGING_DEFAULTS.seatingExcessMm;
  const bad = judgement.ends.filter(
    (e) => e.record.seatingMm !== null && e.record.seatingMm > p.anchorSetMm + threshold + 1e-9,
  );
  if (!bad.length) return null;
  return {
    kind: "seating_excess",
    reason: bad
      .map(
        (e) =>
          `Seating measured ${showLength(p, e.record.seatingMm!)} at end ${e.end}, more than ${showLength(p, threshold)} above the plan's ${showLength(p, p.anchorSetMm)}.`,
      )
      .join(" "),
    recordId: bad[0]!.record.id,
  };
};
