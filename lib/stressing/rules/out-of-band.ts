import { showLength, showPct } from "@/lib/format/quantities";
import { showBandEdge } from "../display";
import type { Rule } from "./types";

/**
 * The measured elongation differs from the prediction by more than the project's band (±7 % by
 * default, ACI 318-11 §18.20.1, from memory), judged once every end the schedule stresses is in.
 */
export const outOfBand: Rule = ({ input, judgement: j }) => {
  const c = j.comparison;
  if (j.provisional || !c || c.verdict === "in band" || j.measuredMm === null || j.predictedMm === null) return null;
  const p = input.project;
  return {
    kind: "out_of_band",
    reason:
      `Measured ${showLength(p, j.measuredMm)} against ${showLength(p, j.predictedMm)} predicted ` +
      `(${j.basisLabel}): ${showPct(c.deviationPct)}, ${c.verdict} of the ±${p.tolerancePct} % band ` +
      `(${showBandEdge(p, c.lowerMm, "lower")} to ${showBandEdge(p, c.upperMm, "upper")}).`,
    recordId: j.ends.at(-1)?.record.id ?? null,
  };
};
