import type { Selectable } from "kysely";
import { z } from "zod";
import type { LiftoffChecksTable } from "@/db/types";
import type { LiftoffJudgement } from "@/lib/stressing/liftoff";
import type { TendonEnd } from "./domain";
import { text } from "./text";

/**
 * A lift-off check as the tablet's outbox sends it (op kind liftoff_check; the op's recordId is
 * the check's id): the gauge pressure at lift-off exactly as typed, with the unit a bare number
 * is read in, at one end with one equipment set, answering the engineer's disposition that
 * ordered it. Who and when: the person signed in on the tablet and the device's time. The server
 * reads the pressure again, converts it on the calibration in force that day and judges it
 * (lib/stressing/liftoff.ts).
 */
export const liftoffPayloadSchema = z
  .object({
    projectId: z.uuid({ error: "Name the project." }),
    pourId: z.uuid({ error: "Name the pour." }),
    tendonId: z.uuid({ error: "Name the tendon." }),
    dispositionId: z.uuid({ error: "Name the engineer's disposition that ordered the lift-off check." }),
    tendonEnd: z.enum(["A", "B"], { error: "Choose the end the lift-off was read at (A or B)." }),
    equipmentSetId: z.uuid({ error: "Choose the equipment set used." }),
    pressure: text({ error: "Type the lift-off gauge pressure." })
      .trim()
      .min(1, "Type the lift-off gauge pressure.")
      .max(40, "Keep the lift-off gauge pressure under 40 characters."),
    pressureUnit: z.enum(["psi", "MPa"], { error: "The pressure unit must be psi or MPa." }),
    checkedAt: z.iso.datetime({ offset: true, error: "The time of the check must be an ISO date and time." }),
    authorUserId: z.uuid({ error: "Name the person who made the check." }),
  })
  .strict();
export type LiftoffPayload = z.infer<typeof liftoffPayloadSchema>;

/**
 * A lift-off check as the server stored and judged it, as every reader gets it (the tablet's pull,
 * the tendon's review page, the stressing report): the one DTO, made from a row by
 * `liftoffCheckFromRow` only. SI; the pressure as typed beside it.
 */
export interface LiftoffCheck extends LiftoffJudgement {
  id: string;
  projectId: string;
  pourId: string;
  tendonId: string;
  /** The disposition that ordered it. */
  dispositionId: string;
  tendonEnd: TendonEnd;
  equipmentSetId: string;
  calibrationId: string;
  /** The gauge pressure at lift-off as typed, e.g. "5950" with unit psi; the judge's figures beside it. */
  entered: { pressure: string; unit: "psi" | "MPa" };
  /** The flag it raised outside the band; null within it. */
  raisedFlagId: string | null;
  /** ISO instant, the tablet's time of the check. */
  checkedAt: string;
  /** Who made the check (the person signed in on the tablet). */
  checkedByName: string;
}

/** The columns of `liftoff_checks` that `liftoffCheckFromRow` reads, beside `users.name as checked_by_name`. */
export const LIFTOFF_CHECK_COLUMNS = [
  "id",
  "project_id",
  "pour_id",
  "tendon_id",
  "disposition_id",
  "tendon_end",
  "equipment_set_id",
  "calibration_id",
  "entered",
  "pressure_mpa",
  "liftoff_force_n",
  "expected_force_n",
  "deviation_pct",
  "band_pct",
  "within_band",
  "raised_flag_id",
  "checked_at",
] as const satisfies readonly (keyof LiftoffChecksTable)[];

export type LiftoffCheckRow = Omit<
  Pick<Selectable<LiftoffChecksTable>, (typeof LIFTOFF_CHECK_COLUMNS)[number]>,
  "checked_at"
> & { checked_at: Date | string; checked_by_name: string };

export function liftoffCheckFromRow(row: LiftoffCheckRow): LiftoffCheck {
  return {
    id: row.id,
    projectId: row.project_id,
    pourId: row.pour_id,
    tendonId: row.tendon_id,
    dispositionId: row.disposition_id,
    tendonEnd: row.tendon_end,
    equipmentSetId: row.equipment_set_id,
    calibrationId: row.calibration_id,
    entered: row.entered,
    pressureMPa: row.pressure_mpa,
    liftoffForceN: row.liftoff_force_n,
    expectedForceN: row.expected_force_n,
    deviationPct: row.deviation_pct,
    bandPct: row.band_pct,
    withinBand: row.within_band,
    raisedFlagId: row.raised_flag_id,
    checkedAt: new Date(row.checked_at).toISOString(),
    checkedByName: row.checked_by_name,
  };
}
