import type { Selectable } from "kysely";
import { z } from "zod";
import type { CalibrationPoint, CalibrationsTable } from "@/db/types";
import { latestDayAnywhere } from "@/lib/format/dates";
import { text } from "./text";

/** A calibration as the certificate gives it: load-cell forces at gauge pressures, in SI. */
export const calibrationSchema = z
  .strictObject({
    calibratedOn: z.iso.date({ error: "Give the calibration date as YYYY-MM-DD." }),
    validUntil: z.iso.date({ error: "Give the expiry as YYYY-MM-DD." }).nullable(),
    points: z
      .array(
        z.strictObject({
          pressureMPa: z
            .number({ error: "Give the pressure." })
            .min(0, "Pressure cannot be negative.")
            .max(250, "Above 250 MPa (36,000 psi) looks wrong."),
          forceN: z
            .number({ error: "Give the force." })
            .min(0, "Force cannot be negative.")
            .max(20_000_000, "That force looks wrong."),
        }),
      )
      .min(2, "Give at least two points; five or more show a bad one.")
      .max(50, "At most 50 points."),
    laboratory: text().trim().max(160, "Use at most 160 characters.").nullable(),
    certificateAttachmentId: z.uuid({ error: "Upload the certificate again." }).nullable(),
  })
  .superRefine((c, ctx) => {
    if (c.calibratedOn > latestDayAnywhere()) {
      ctx.addIssue({
        code: "custom",
        path: ["calibratedOn"],
        message: "The calibration date is in the future; give the day the set was calibrated.",
      });
    }
    if (c.validUntil && c.validUntil < c.calibratedOn) {
      ctx.addIssue({ code: "custom", path: ["validUntil"], message: "The expiry is before the calibration date." });
    }
    const pressures = new Set(c.points.map((p) => p.pressureMPa));
    if (pressures.size < 2)
      ctx.addIssue({ code: "custom", path: ["points"], message: "The points must be at different pressures." });
  });
export type CalibrationInput = z.infer<typeof calibrationSchema>;

/** Days before expiry when a set is marked as running out. */
export const EXPIRING_WITHIN_DAYS = 14;

export type CalibrationState = "valid" | "expiring" | "expired" | "none";

export const CALIBRATION_STATE_LABELS: Record<CalibrationState, string> = {
  valid: "Calibrated",
  expiring: "Runs out soon",
  expired: "Expired",
  none: "No calibration",
};

/** Whole days from one calendar day to another (YYYY-MM-DD), negative when `to` is earlier. */
export function daysBetween(from: string, to: string): number {
  return Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / 86_400_000);
}

export function addDays(day: string, days: number): string {
  return new Date(Date.parse(`${day}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);
}

/** A set's state on a day: expired after its last valid day, running out within 14 days. */
export function calibrationState(validUntil: string | null, today: string): CalibrationState {
  if (!validUntil) return "none";
  const left = daysBetween(today, validUntil);
  if (left < 0) return "expired";
  return left <= EXPIRING_WITHIN_DAYS ? "expiring" : "valid";
}

/**
 * A calibration as every reader gets it (the tablet's pull, the equipment list, the evaluation,
 * the pour report, the lift-off check): the one DTO, made from a row by `calibrationFromRow` only.
 */
export interface Calibration {
  id: string;
  projectId: string;
  equipmentSetId: string;
  /** YYYY-MM-DD. */
  calibratedOn: string;
  /** YYYY-MM-DD, the last valid day. */
  validUntil: string;
  /** The certificate's points, SI. */
  points: CalibrationPoint[];
  /** The fitted line: force (N) = slope × pressure (MPa) + intercept, with its r². */
  slope: number;
  intercept: number;
  r2: number;
  /** The calibrated range of gauge pressure. */
  minPressureMPa: number;
  maxPressureMPa: number;
  laboratory: string | null;
  certificateAttachmentId: string | null;
  /** Retired or corrected (an ISO instant): never picked again (`pickCalibration`). */
  retiredAt: string | null;
  retiredReason: string | null;
  /** The calibration that corrects this one. */
  replacedBy: string | null;
}

/** The columns `calibrationFromRow` reads: select these (`.select(CALIBRATION_COLUMNS)`). */
export const CALIBRATION_COLUMNS = [
  "id",
  "project_id",
  "equipment_set_id",
  "calibrated_on",
  "valid_until",
  "points",
  "slope_n_per_mpa",
  "intercept_n",
  "r2",
  "min_pressure_mpa",
  "max_pressure_mpa",
  "laboratory",
  "certificate_attachment_id",
  "retired_at",
  "retired_reason",
  "replaced_by",
] as const satisfies readonly (keyof CalibrationsTable)[];

/** A calibrations row as read directly (instants as Date) or out of a JSON aggregate (as text). */
export type CalibrationRow = Omit<
  Pick<Selectable<CalibrationsTable>, (typeof CALIBRATION_COLUMNS)[number]>,
  "retired_at"
> & {
  retired_at: Date | string | null;
};

export function calibrationFromRow(row: CalibrationRow): Calibration {
  return {
    id: row.id,
    projectId: row.project_id,
    equipmentSetId: row.equipment_set_id,
    calibratedOn: row.calibrated_on,
    validUntil: row.valid_until,
    points: row.points,
    slope: row.slope_n_per_mpa,
    intercept: row.intercept_n,
    r2: row.r2,
    minPressureMPa: row.min_pressure_mpa,
    maxPressureMPa: row.max_pressure_mpa,
    laboratory: row.laboratory,
    certificateAttachmentId: row.certificate_attachment_id,
    retiredAt: row.retired_at ? new Date(row.retired_at).toISOString() : null,
    retiredReason: row.retired_reason,
    replacedBy: row.replaced_by,
  };
}

// Kept in a module without zod, so the tablet's tendon list can pick a calibration without loading zod.
export { pickCalibration, type PickableCalibration } from "./pick-calibration";

export const calibrationParamsSchema = z.object({
  projectId: z.uuid({ error: "Not a project id." }),
  setId: z.uuid({ error: "Not an equipment set id." }),
  calibrationId: z.uuid({ error: "Not a calibration id." }),
});

const calibrationReason = (what: string) =>
  text({ error: `Write why the calibration is ${what}.` })
    .trim()
    .min(10, `Write why the calibration is ${what}, in a sentence (at least 10 characters).`)
    .max(2000, "Use at most 2,000 characters.");

/** Retiring a calibration: it is never picked again; the reason is kept and audited. */
export const calibrationRetirementSchema = z.strictObject({ reason: calibrationReason("retired") });
export type CalibrationRetirementInput = z.infer<typeof calibrationRetirementSchema>;

/** Correcting a calibration: the certificate's figures as they should have been typed, and why. */
export const calibrationCorrectionSchema = z.strictObject({
  reason: calibrationReason("corrected"),
  calibration: calibrationSchema,
});
export type CalibrationCorrectionInput = z.infer<typeof calibrationCorrectionSchema>;
