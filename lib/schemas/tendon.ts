import type { Selectable } from "kysely";
import { z } from "zod";
import type { TendonSegment, TendonsTable } from "@/db/types";
import { text } from "./text";
import { ASTM_A416_GRADE_270, findStrandSize, jackingAboveLimit, stressLimits } from "@/lib/elongation";
import { N_PER_KIP } from "@/lib/units";
import { STRESSING_ENDS, TENDON_KINDS, type StressingEnds, type StressingOrder, type TendonKind } from "./domain";

export const STRAND_SIZES = ASTM_A416_GRADE_270.map((s) => s.designation) as [string, ...string[]];
export const KIND_LABELS: Record<TendonKind, string> = {
  unbonded_monostrand: "Unbonded monostrand",
  bonded_multistrand: "Bonded multistrand",
};

/** A spreadsheet runs a cell that starts with one of these as a formula. */
export const FORMULA_START = /^[=+\-@\t\r]/;

/** A name a person typed that will later land in CSV files and reports. */
export const plainText = (what: string, max: number) =>
  text({ error: `Give the ${what}.` })
    .trim()
    .min(1, `Give the ${what}.`)
    .max(max, `Use at most ${max} characters.`)
    .refine(
      (v) => !FORMULA_START.test(v),
      `The ${what} may not start with =, +, -, @ (a spreadsheet would run it as a formula).`,
    )
    .refine((v) => !/[\u0000-\u001f\u007f]/.test(v), `The ${what} may not hold control characters.`);

export const tagSchema = plainText("tag as drawn", 40);

export const segmentSchema = z.strictObject({
  lengthMm: z
    .number({ error: "Give the segment length." })
    .positive("A segment must be longer than 0.")
    .max(300_000, "A segment over 300 m (980 ft) looks wrong."),
  angleRad: z
    .number({ error: "Give the angle change." })
    .min(0, "The angle change is an absolute value (0 or more).")
    .max(Math.PI, "An angle change above 180° looks like degrees typed as radians."),
});

export const tendonSchema = z
  .strictObject({
    tag: tagSchema,
    kind: z.enum(TENDON_KINDS, { error: "Pick unbonded monostrand or bonded multistrand." }),
    strandSize: z.enum(STRAND_SIZES, { error: `Pick a strand size: ${STRAND_SIZES.join(", ")}.` }),
    strandCount: z
      .number({ error: "Give the number of strands." })
      .int("Use a whole number of strands.")
      .min(1, "At least 1 strand.")
      .max(61, "At most 61 strands."),
    segments: z.array(segmentSchema).min(1, "Give at least one segment.").max(200, "At most 200 segments."),
    ends: z.enum(STRESSING_ENDS, { error: "Pick the stressing end: A, B or both." }),
    jackGripMm: z
      .number({ error: "Give the grip length." })
      .min(0, "The grip length cannot be negative.")
      .max(2000, "A grip over 2 m looks wrong.")
      .nullable(),
    shopElongationMm: z
      .number({ error: "Give the shop-drawing elongation." })
      .positive("The elongation must be above 0.")
      .max(5000, "Over 5 m looks wrong.")
      .nullable(),
    strandLotId: z.uuid({ error: "Pick a strand lot of this project." }).nullable(),
    /** The beam, slab strip or band the tendon belongs to; none: the pour is its group. */
    member: plainText("member", 80).nullable().optional(),
    /** How a two-end tendon is stressed, as the schedule says; the record form's default. */
    stressingOrder: z
      .enum(["sequential", "simultaneous"], { error: "The stressing order is sequential or simultaneous." })
      .nullable()
      .optional(),
    /**
     * The tendon's own specified jacking force, N; null: the project's factor of fpu·A. Absent from a
     * body: an edit keeps the stored value.
     */
    jackingForceN: z
      .number({ error: "Give the jacking force." })
      .positive("The jacking force must be above 0.")
      .nullable()
      .optional(),
  })
  .superRefine((t, ctx) => {
    const over = jackingForceOverLimit(t);
    if (over)
      ctx.addIssue({
        code: "custom",
        path: ["jackingForceN"],
        message: `The jacking force is above 0.80·fpu·A = ${over} for ${t.strandCount} × ${t.strandSize} strand (ACI 318-19 Table 20.3.2.5.1); give at most that, or leave it empty for the project's factor.`,
      });
    if (t.stressingOrder && t.ends !== "both")
      ctx.addIssue({
        code: "custom",
        path: ["stressingOrder"],
        message: "Only a tendon stressed at both ends has a stressing order; leave it empty.",
      });
    if (t.kind === "unbonded_monostrand" && t.strandCount !== 1) {
      ctx.addIssue({ code: "custom", path: ["strandCount"], message: "An unbonded monostrand tendon has 1 strand." });
    }
  });
export type TendonInput = z.infer<typeof tendonSchema>;

// Shown rounded down, so a force typed as shown is never above the limit.
const down = (n: number, per: number) => (Math.floor((n / per) * 100) / 100).toFixed(2);

/**
 * The 0.80·fpu·A ceiling (nominal strand, as the judge's jacking rule reads it) in kip and kN when a
 * schedule's force is above it, else null: the same rule as the jacking-over-limit flag.
 */
export function jackingForceOverLimit(t: {
  strandSize: string;
  strandCount: number;
  jackingForceN?: number | null;
}): string | null {
  const nominal = findStrandSize(t.strandSize);
  if (t.jackingForceN === null || t.jackingForceN === undefined || !nominal) return null;
  if (!Number.isInteger(t.strandCount) || t.strandCount < 1) return null;
  const limits = stressLimits({ breakingLoadPerStrandN: nominal.minBreakingStrengthN, strandCount: t.strandCount });
  if (!jackingAboveLimit(t.jackingForceN, limits)) return null;
  return `${down(limits.jackingLimitN, N_PER_KIP)} kip (${down(limits.jackingLimitN, 1000)} kN)`;
}

export const tendonParamsSchema = z.object({
  projectId: z.uuid({ error: "Not a project id." }),
  tendonId: z.uuid({ error: "Not a tendon id." }),
});

/** A parabolic drape h over a half span l turns the tendon by 2h/l (common practice). */
export function drapeAngleRad(drapeMm: number, halfSpanMm: number): number {
  return (2 * drapeMm) / halfSpanMm;
}

export const importScheduleSchema = z.strictObject({
  csv: text({ error: "Send the CSV file's text." })
    .min(1, "The file is empty.")
    .max(8_000_000, "The file is over 8 MB; split it by pour."),
});

/**
 * A tendon as every reader gets it (the tablet's pull, the pour's tendon list, the tendon's basis
 * and screen): the one DTO, made from a row by `tendonFromRow` only. SI, as scheduled.
 */
export interface Tendon {
  id: string;
  projectId: string;
  pourId: string;
  tag: string;
  kind: TendonKind;
  strandSize: string;
  strandCount: number;
  /** From end A. */
  segments: TendonSegment[];
  ends: StressingEnds;
  jackGripMm: number | null;
  strandLotId: string | null;
  /** The approved shop-drawing elongation of the whole tendon, when the schedule gives one. */
  shopElongationMm: number | null;
  /** The member the schedule names; null when the pour is the tendon's group. */
  member: string | null;
  /** How the schedule says a two-end tendon is stressed, or null. */
  stressingOrder: StressingOrder | null;
  /** The schedule's specified jacking force, N; null: the project's factor of fpu·A. */
  jackingForceN: number | null;
}

/** The columns `tendonFromRow` reads: select these (`.select(TENDON_COLUMNS)`). */
export const TENDON_COLUMNS = [
  "id",
  "project_id",
  "pour_id",
  "tag",
  "kind",
  "strand_size",
  "strand_count",
  "segments",
  "ends",
  "jack_grip_mm",
  "strand_lot_id",
  "shop_elongation_mm",
  "member",
  "stressing_order",
  "jacking_force_n",
] as const satisfies readonly (keyof TendonsTable)[];

export type TendonRow = Pick<Selectable<TendonsTable>, (typeof TENDON_COLUMNS)[number]>;

export function tendonFromRow(row: TendonRow): Tendon {
  return {
    id: row.id,
    projectId: row.project_id,
    pourId: row.pour_id,
    tag: row.tag,
    kind: row.kind,
    strandSize: row.strand_size,
    strandCount: row.strand_count,
    segments: row.segments,
    ends: row.ends,
    jackGripMm: row.jack_grip_mm,
    strandLotId: row.strand_lot_id,
    shopElongationMm: row.shop_elongation_mm,
    member: row.member,
    stressingOrder: row.stressing_order,
    jackingForceN: row.jacking_force_n,
  };
}
