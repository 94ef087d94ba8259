import { showPct, showPressure } from "@/lib/format/quantities";
import type { EndJudgement } from "../judge";
import { jackingOverLimit, underForce } from "./forces";
import type { Rule } from "./types";

/** A final pressure is off its target when farther from it than the project's band (a hair of rounding aside). */
export const isOffTarget = (e: Pick<EndJudgement, "offTargetPct">, tolerancePct: number): boolean =>
  e.offTargetPct !== null && Math.abs(e.offTargetPct) > tolerancePct + 1e-9;

/**
 * A final gauge pressure farther from the target than the band: the tablet asks the crew to read
 * the gauge again or to say why, and the record carries the answer. Raised whether or not a reason
 * came with the record (a record without one, from a tablet that did not ask, says so), so such an
 * end is never shown green before the engineer of record has seen it. One flag for one fact: when
 * the gauge force is already flagged short of the specified force or over a limit, that flag holds
 * the tendon and the crew's reason shows beside the record.
 */
export const gaugeOffTarget: Rule = (state) => {
  const { input, judgement } = state;
  const p = input.project;
  if (underForce(state) || jackingOverLimit(state)) return null;
  const off = judgement.ends.filter((e) => isOffTarget(e, p.tolerancePct));
  if (!off.length) return null;
  return {
    kind: "gauge_off_target",
    reason: off
      .map((e) => {
        const said = e.record.gaugeOffTarget?.reason;
        return (
          `End ${e.end}: final gauge ${showPressure(p, e.record.finalPressureMPa)} is ${showPct(e.offTargetPct!)} from the target ` +
          `${showPressure(p, e.targetPressureMPa!)} (band ±${p.tolerancePct} %); ` +
          (said ? `the crew confirmed it: “${said}”.` : "no reason came with the record.")
        );
      })
      .join(" "),
    recordId: off[0]!.record.id,
  };
};
