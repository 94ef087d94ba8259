import type { FlagKind, FlagStatus } from "./domain";

/**
 * What each flag is called on screens, e-mails and reports. Keyed by every kind, so a new kind
 * without words fails the typecheck instead of showing its internal name.
 */
export const FLAG_LABELS: Record<FlagKind, string> = {
  out_of_band: "Out of band",
  jacking_over_limit: "Jacking force over limit",
  anchor_over_limit: "Anchor force over 0.70·fpu",
  calibration_expired: "Calibration expired",
  calibration_range: "Reading outside calibration",
  wire_break: "Wire break",
  concrete_unconfirmed: "Concrete strength not confirmed",
  reading_missing: "Reading missing",
  stressed_twice: "Stressed twice",
  under_force: "Jacking force short of specified",
  seating_excess: "Seating larger than planned",
  cut_while_held: "Tails cut while held",
  group_out_of_band: "Group average out of band",
  member_wire_loss: "Member over its wire-break limit",
  liftoff_out_of_band: "Lift-off force outside band",
  force_disagreement: "Elongation and gauge force disagree",
  gauge_off_target: "Gauge off its target pressure",
};

export const flagLabel = (kind: string): string => FLAG_LABELS[kind as FlagKind] ?? kind.replaceAll("_", " ");

export const FLAG_STATUS_LABELS: Record<FlagStatus, string> = {
  open: "Open",
  with_engineer: "With the engineer",
  closed: "Closed",
};
