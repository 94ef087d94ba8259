import { judgeStressing, type JudgeInput, type StressingJudgement } from "../judge";
import { calibrationExpired } from "./calibration-expired";
import { calibrationRange } from "./calibration-range";
import { concreteUnconfirmed } from "./concrete-unconfirmed";
import { forceDisagreement } from "./force-disagreement";
import { gaugeOffTarget } from "./gauge-off-target";
import { anchorOverLimit, jackingOverLimit, underForce } from "./forces";
import { groupOutOfBand } from "./group-out-of-band";
import { memberWireLoss } from "./member-wire-loss";
import { outOfBand } from "./out-of-band";
import { seatingExcess } from "./seating-excess";
import { stressedTwice } from "./stressed-twice";
import type { Finding, Rule, RuleKind } from "./types";
import { wireBreak } from "./wire-break";

export type { Finding, Rule, RuleKind, RuleState } from "./types";

/**
 * Every flag rule, one small function each: kind → rule(state) → finding | null. To add a rule,
 * write it in its own file beside these, add its kind to `RuleKind` and the database's check, and
 * list it here.
 */
export const FLAG_RULES: { [K in RuleKind]: Rule } = {
  stressed_twice: stressedTwice,
  calibration_expired: calibrationExpired,
  calibration_range: calibrationRange,
  wire_break: wireBreak,
  jacking_over_limit: jackingOverLimit,
  anchor_over_limit: anchorOverLimit,
  under_force: underForce,
  force_disagreement: forceDisagreement,
  gauge_off_target: gaugeOffTarget,
  seating_excess: seatingExcess,
  out_of_band: outOfBand,
  concrete_unconfirmed: concreteUnconfirmed,
  group_out_of_band: groupOutOfBand,
  member_wire_loss: memberWireLoss,
};

/** Runs every rule over a judgement. */
export function findFlags(input: JudgeInput, judgement: StressingJudgement): Finding[] {
  return Object.values(FLAG_RULES)
    .map((rule) => rule({ input, judgement }))
    .filter((f): f is Finding => f !== null);
}

/** Judges a tendon and runs the rules: what the server writes and the tablet shows. */
export function judgeAndFlag(input: JudgeInput): { judgement: StressingJudgement; findings: Finding[] } {
  const judgement = judgeStressing(input);
  return { judgement, findings: findFlags(input, judgement) };
}
