import type { JudgeInput, StressingJudgement } from "../judge";

/** Every kind of flag a rule raises; the database's `flags.kind` check lists the same names. */
export type RuleKind =
  | "out_of_band"
  | "jacking_over_limit"
  | "anchor_over_limit"
  | "under_force"
  | "calibration_expired"
  | "calibration_range"
  | "seating_excess"
  | "wire_break"
  | "concrete_unconfirmed"
  | "stressed_twice"
  | "group_out_of_band"
  | "member_wire_loss"
  | "force_disagreement"
  | "gauge_off_target";

export interface Finding {
  kind: RuleKind;
  reason: string;
  recordId: string | null;
}

/** What every rule sees: the facts judged and the judgement. */
export interface RuleState {
  input: JudgeInput;
  judgement: StressingJudgement;
}

/** One flag rule: a small pure function from the state to a finding, or null when it does not apply. */
export type Rule = (state: RuleState) => Finding | null;
