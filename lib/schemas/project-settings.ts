import { z } from "zod";
import { text } from "./text";
import {
  COMPARISON_BASES,
  RELEASERS,
  STORED_RESOLUTIONS,
  UNIT_SYSTEMS,
  type StoredResolution as DbResolution,
  type UnitSystem as DbSystem,
} from "./domain";
import type { ReadingResolution, UnitSystem } from "@/lib/units";
import { emailSchema } from "./account";

/** True for an IANA time zone name the runtime knows. */
export function isTimeZone(name: string): boolean {
  if (!/^[A-Za-z0-9_+\-/]{1,64}$/.test(name)) return false;
  try {
    new Intl.DateTimeFormat("en-US", { timeZone: name });
    return true;
  } catch {
    return false;
  }
}

/**
 * A project's settings, stored in SI (mm, MPa, K per metre). Forms show them in the project's
 * units and convert before sending; this schema checks what arrives.
 */
const optionalPositive = (message: string, max: number, maxMessage: string) =>
  z.number({ error: message }).positive(message).max(max, maxMessage).nullable();

export const projectSettingsSchema = z.strictObject({
  name: text().trim().min(2, "Give the project a name.").max(160, "Use at most 160 characters."),
  address: text().trim().max(300, "Use at most 300 characters.").nullable(),
  unitSystem: z.enum(UNIT_SYSTEMS, { error: "Pick US customary or SI units." }),
  readingResolution: z.enum(STORED_RESOLUTIONS, {
    error: "Pick the reading division: 1/8 in, 1/16 in or 1 mm.",
  }),
  tolerancePct: z
    .number({ error: "Give the band in %." })
    .positive("The band must be above 0 %.")
    .max(25, "A band above 25 % is not a check."),
  groupTolerancePct: optionalPositive(
    "Give the group band in %, or leave it empty.",
    25,
    "A band above 25 % is not a check.",
  ),
  shortTendonFloorMm: optionalPositive(
    "Give the floor as a length, or leave it empty.",
    50,
    "A floor above 50 mm (2 in) would hide real problems.",
  ),
  comparisonBasis: z.enum(COMPARISON_BASES, { error: "Pick gross at jacking or net of anchor set." }),
  countJackGrip: z.boolean({ error: "Say whether strand inside the jack is counted." }),
  frictionMu: z.number({ error: "Give μ as a number." }).min(0, "μ cannot be negative.").lt(1, "μ must be below 1."),
  wobblePerM: z
    .number({ error: "Give K as a number." })
    .min(0, "K cannot be negative.")
    .lt(0.1, "K looks too high; check per ft against per m."),
  anchorSetMm: z
    .number({ error: "Give the anchor set as a length." })
    .min(0, "Anchor set cannot be negative.")
    .lt(50, "Anchor set must be below 50 mm (2 in)."),
  calibrationValidityDays: z
    .number({ error: "Give a number of days." })
    .int("Use whole days.")
    .min(1, "At least 1 day.")
    .max(1096, "At most 3 years (1096 days)."),
  requiredConcreteMPa: optionalPositive(
    "Give the strength, or leave it empty.",
    120,
    "Above 120 MPa (17,400 psi) looks wrong.",
  ),
  engineerOfRecordName: text().trim().max(160, "Use at most 160 characters.").nullable(),
  engineerOfRecordEmail: emailSchema.nullable(),
  notifyEmails: z.array(emailSchema).max(20, "At most 20 addresses."),
  blindEntry: z.boolean({ error: "Say whether the crew sees predicted values before entering readings." }),
  releaseBy: z.enum(RELEASERS, { error: "Pick who releases a pour." }),
  // Judging settings (lib/stressing/judge.ts); left out, the stored values stay.
  timeZone: z
    .string({ error: "Give the site's time zone, e.g. America/Chicago." })
    .trim()
    .refine(isTimeZone, "The site's time zone is not a time zone name; use one like America/Chicago.")
    .optional(),
  jackingForceFactor: z
    .number({ error: "Give the jacking force as a fraction of fpu·A, e.g. 0.80." })
    .min(0.5, "Below 0.50·fpu·A is not a stressing force.")
    .max(0.8, "Above 0.80·fpu·A exceeds the code limit (ACI 318-19 Table 20.3.2.5.1).")
    .optional(),
  liftoffBandPct: z
    .number({ error: "Give the lift-off band in %." })
    .positive("The band must be above 0 %.")
    .max(25, "A band above 25 % is not a check.")
    .optional(),
  wireLossLimitPct: z
    .number({ error: "Give the member's wire-break limit in %." })
    .positive("The limit must be above 0 %.")
    .max(10, "More than 10 % of a member's steel lost is not a check.")
    .optional(),
  underForcePct: z
    .number({ error: "Give the under-force threshold in %." })
    .min(0, "The threshold cannot be negative.")
    .max(10, "More than 10 % under force is not a check.")
    .optional(),
  seatingExcessMm: z
    .number({ error: "Give the seating threshold as a length." })
    .min(0, "The threshold cannot be negative.")
    .lt(50, "The threshold must be below 50 mm (2 in).")
    .optional(),
  clockSkewMinutes: z
    .number({ error: "Give the clock check in whole minutes." })
    .int("Give the clock check in whole minutes.")
    .min(1, "The clock check must be at least 1 minute.")
    .max(1440, "The clock check must be at most 1440 minutes (a day).")
    .optional(),
  // When the project's shifts end, minutes after local midnight; the engineer's digest goes after each.
  shiftEndMinutes: z
    .array(
      z
        .number({ error: "Give each shift end as a time of day, e.g. 18:00." })
        .int("Give each shift end in whole minutes.")
        .min(0, "A shift end is a time of day, 00:00 to 23:59.")
        .max(1439, "A shift end is a time of day, 00:00 to 23:59."),
      { error: "Give the shift ends as times of day, e.g. 18:00." },
    )
    .min(1, "Give at least one shift end, e.g. 18:00.")
    .max(4, "At most 4 shift ends a day.")
    .refine((ends) => new Set(ends).size === ends.length, "A shift end is given twice.")
    .optional(),
  governing: z
    .enum(["tautline", "shop_drawing"], {
      error: "Pick which elongation governs the verdict: Tautline's prediction or the approved shop drawing.",
    })
    .optional(),
});
export type ProjectSettings = z.infer<typeof projectSettingsSchema>;

/** The units a project displays, in the vocabulary of lib/units. */
export function displayUnits(project: { unitSystem: DbSystem; readingResolution: DbResolution }): {
  system: UnitSystem;
  resolution: ReadingResolution;
  length: "in" | "mm";
  longLength: "ft" | "m";
  pressure: "psi" | "MPa";
  force: "kip" | "kN";
} {
  const resolution: ReadingResolution =
    project.readingResolution === "1mm" ? "1 mm" : project.readingResolution === "1/16in" ? "1/16 in" : "1/8 in";
  return project.unitSystem === "us"
    ? { system: "US", resolution, length: "in", longLength: "ft", pressure: "psi", force: "kip" }
    : { system: "SI", resolution, length: "mm", longLength: "m", pressure: "MPa", force: "kN" };
}

/**
 * Exactly the fields the settings schema takes, from a wider view of the project (the screens read
 * its id and code too): what the settings form starts from and sends, since the schema refuses any
 * other field by name.
 */
export function settingsFields(view: ProjectSettings): ProjectSettings {
  const keys = Object.keys(projectSettingsSchema.shape) as (keyof ProjectSettings)[];
  return Object.fromEntries(keys.map((k) => [k, view[k]])) as ProjectSettings;
}
