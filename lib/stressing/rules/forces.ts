import { checkStressLimits, findStrandSize, forceFromPressure, predictElongation, type Check } from "@/lib/elongation";
import { MPA_PER_PSI } from "@/lib/units";
import { showForce } from "@/lib/format/quantities";
import { JUDGING_DEFAULTS, type EndJudgement } from "../judge";
import { specifiedForceSourceWords } from "../display";
import type { Rule, RuleState } from "./types";

/** Half of a 100 psi gauge graduation, in MPa: a dial is read to its graduation (UFGS 02490, from memory). */
export const HALF_GRADUATION_MPA = 50 * MPA_PER_PSI;

/** The lowest and highest force a dial reading allows (± half a graduation), per end read on a calibration. */
export function forceBounds(e: EndJudgement): { lowN: number; highN: number } | null {
  if (!e.calibration) return null;
  const p = e.record.finalPressureMPa;
  return {
    lowN: forceFromPressure(e.calibration, Math.max(0, p - HALF_GRADUATION_MPA)),
    highN: forceFromPressure(e.calibration, p + HALF_GRADUATION_MPA),
  };
}

/** The ACI 318 limits on the force the gauge says was reached at least, with the seating it leaves. */
function limitChecks({ input, judgement }: RuleState): { checks: Check[]; recordId: string | null } {
  const nominal = findStrandSize(input.tendon.strandSize);
  const reached = judgement.ends
    .map((e) => ({ e, b: forceBounds(e) }))
    .filter((x): x is { e: EndJudgement; b: { lowN: number; highN: number } } => x.b !== null);
  if (!nominal || !reached.length) return { checks: [], recordId: null };
  const top = reached.reduce((a, b) => (b.b.lowN > a.b.lowN ? b : a));
  const achievedN = top.b.lowN;
  if (!(achievedN > 0)) return { checks: [], recordId: null };
  const p = input.project;
  const atAchieved = predictElongation({
    segments: input.tendon.segments,
    strandAreaMm2: judgement.strand.areaMm2,
    strandCount: input.tendon.strandCount,
    modulusMPa: judgement.strand.modulusMPa,
    jackingForceN: achievedN,
    wobblePerM: p.wobblePerM,
    mu: p.frictionMu,
    anchorSetMm: p.anchorSetMm > 0 ? p.anchorSetMm : undefined,
    ends: input.tendon.ends,
  });
  const set = input.sets.find((s) => s.id === top.e.record.equipmentSetId);
  return {
    checks: checkStressLimits({
      breakingLoadPerStrandN: nominal.minBreakingStrengthN,
      strandCount: input.tendon.strandCount,
      jackingForceN: achievedN,
      anchorForceAfterN: atAchieved.seating?.anchorForceAfterN,
      equipmentMaxForceN: set?.maxForceN ?? undefined,
    }),
    recordId: top.e.record.id,
  };
}

/** Jacking force above 0.80·fpu·A (ACI 318-19 Table 20.3.2.5.1) or the equipment set's rated maximum. */
export const jackingOverLimit: Rule = (state) => {
  const { checks, recordId } = limitChecks(state);
  const p = state.input.project;
  const words = checks
    .filter((c) => c.code === "jacking-over-limit" || c.code === "jacking-over-equipment")
    .map((c) =>
      c.code === "jacking-over-limit"
        ? `Jacking force reached at least ${showForce(p, c.value)} (gauge reading less half a graduation), above 0.80·fpu·A = ${showForce(p, c.limit)} (ACI 318-19 Table 20.3.2.5.1).`
        : `Jacking force reached at least ${showForce(p, c.value)}, above the equipment set's rated maximum ${showForce(p, c.limit)}.`,
    );
  return words.length ? { kind: "jacking_over_limit", reason: words.join(" "), recordId } : null;
};

/** Force at the anchor after seating above 0.70·fpu·A (ACI 318-19 Table 20.3.2.5.1). */
export const anchorOverLimit: Rule = (state) => {
  const { checks, recordId } = limitChecks(state);
  const c = checks.find((x) => x.code === "anchor-over-limit");
  if (!c) return null;
  const p = state.input.project;
  return {
    kind: "anchor_over_limit",
    reason: `Force at the anchor after seating ${showForce(p, c.value)} is above 0.70·fpu·A = ${showForce(p, c.limit)} (ACI 318-19 Table 20.3.2.5.1).`,
    recordId,
  };
};

/**
 * The gauge force reached (the highest the reading allows) short of the specified jacking force by
 * more than the project's threshold (2 % by default, common practice). The force the elongation
 * implies is given beside it, as the code asks for both force and elongation.
 */
export const underForce: Rule = ({ input, judgement }) => {
  const p = input.project;
  const pct = p.underForcePct ?? JUDGING_DEFAULTS.underForcePct;
  const floorN = judgement.specifiedForceN * (1 - pct / 100);
  const low = judgement.ends.filter((e) => {
    const b = forceBounds(e);
    return b !== null && e.outsideRangeMPa.length === 0 && b.highN < floorN;
  });
  if (!low.length) return null;
  return {
    kind: "under_force",
    reason: low
      .map(
        (e) =>
          `End ${e.end} reached ${showForce(p, e.gaugeForceN!)} on the gauge, ${((e.gaugeForceN! / judgement.specifiedForceN) * 100).toFixed(1)} % of the specified ${showForce(p, judgement.specifiedForceN)} (${specifiedForceSourceWords(judgement.specifiedForceSource, judgement.specifiedForceFactor)}; more than ${pct} % short)` +
          (e.impliedForceN !== null ? `; the elongation implies ${showForce(p, e.impliedForceN)}.` : "."),
      )
      .join(" "),
    recordId: low[0]!.record.id,
  };
};
