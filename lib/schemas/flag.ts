import type { Selectable } from "kysely";
import type { FlagsTable } from "@/db/types";
import { reference } from "@/lib/format/references";
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

/**
 * A flag as every reader gets it (the tablet's pull, the review queue, the tendon's flag trail,
 * the stressing report): the one DTO, made from a row by `flagFromRow` only. Instants as ISO text.
 */
export interface Flag {
  id: string;
  /** Its number in the project as people cite it ("F-0012"). */
  reference: string;
  projectId: string;
  pourId: string;
  tendonId: string;
  /** The record that raised it, when one did. */
  recordId: string | null;
  evaluationId: string | null;
  kind: FlagKind;
  /** Why it was raised, in words. */
  reason: string;
  status: FlagStatus;
  createdAt: string;
  closedAt: string | null;
  /** The user who closed it; null when the evaluation closed it or it is open. */
  closedBy: string | null;
  closeReason: string | null;
}

/** The columns `flagFromRow` reads: select these (`.select(FLAG_COLUMNS)`). */
export const FLAG_COLUMNS = [
  "id",
  "number",
  "project_id",
  "pour_id",
  "tendon_id",
  "record_id",
  "evaluation_id",
  "kind",
  "reason",
  "status",
  "created_at",
  "closed_at",
  "closed_by",
  "close_reason",
] as const satisfies readonly (keyof FlagsTable)[];

/** A flags row as read directly (instants as Date) or out of a JSON aggregate (as text). */
export type FlagRow = Omit<Pick<Selectable<FlagsTable>, (typeof FLAG_COLUMNS)[number]>, "created_at" | "closed_at"> & {
  created_at: Date | string;
  closed_at: Date | string | null;
};

export function flagFromRow(row: FlagRow): Flag {
  return {
    id: row.id,
    reference: reference("F", Number(row.number)),
    projectId: row.project_id,
    pourId: row.pour_id,
    tendonId: row.tendon_id,
    recordId: row.record_id,
    evaluationId: row.evaluation_id,
    kind: row.kind,
    reason: row.reason,
    status: row.status,
    createdAt: new Date(row.created_at).toISOString(),
    closedAt: row.closed_at === null ? null : new Date(row.closed_at).toISOString(),
    closedBy: row.closed_by,
    closeReason: row.close_reason,
  };
}
