import { z } from "zod";
import { DECISIONS, FLAG_KINDS, TENDON_ENDS, type Decision } from "./domain";
import { text } from "./text";

const reasonText = (what: string) =>
  text({ error: `Write the ${what}.` })
    .trim()
    .min(10, `Write the ${what} in a sentence or more (at least 10 characters).`)
    .max(4000, "Use at most 4,000 characters.");

export const flagParamsSchema = z.object({
  projectId: z.uuid({ error: "Not a project id." }),
  flagId: z.uuid({ error: "Not a flag id." }),
});

export const reviewSchema = z.discriminatedUnion("kind", [
  z.strictObject({ kind: z.literal("note"), body: reasonText("note") }),
  z.strictObject({ kind: z.literal("paperwork_error"), body: reasonText("paperwork error you found") }),
  z.strictObject({
    kind: z.literal("remeasured"),
    body: reasonText("how and where it was re-measured"),
    remeasuredMm: z
      .number({ error: "Enter the re-measured elongation." })
      .positive("The re-measured elongation must be above zero.")
      .max(5000, "That is longer than any tendon stretches."),
  }),
  z.strictObject({
    kind: z.literal("photo"),
    body: reasonText("what the photo shows"),
    attachmentId: z.uuid({ error: "Upload the photo first." }),
  }),
  z.strictObject({ kind: z.literal("sent_to_engineer"), body: reasonText("note for the engineer") }),
  z.strictObject({ kind: z.literal("closed_paperwork"), body: reasonText("reason for closing") }),
]);
export type ReviewInput = z.infer<typeof reviewSchema>;

export const DECISION_LABELS: Record<Decision, string> = {
  accept: "Accept as stressed",
  restress: "Restress",
  detension_restress: "Detension and restress",
  liftoff_check: "Lift-off check",
  replace: "Replace tendon",
  other: "Other instruction",
};

export const dispositionSchema = z.strictObject({
  decision: z.enum(DECISIONS, { error: "Pick a disposition." }),
  reasons: reasonText("reasons for the disposition"),
  licenceStatement: text({ error: "State your licence." })
    .trim()
    .min(6, "State your licence, for example: Licensed professional engineer, State of …, No. …")
    .max(400, "Use at most 400 characters."),
});
export type DispositionInput = z.infer<typeof dispositionSchema>;

export const releaseParamsSchema = z.object({
  projectId: z.uuid({ error: "Not a project id." }),
  pourId: z.uuid({ error: "Not a pour id." }),
});

const confirmedStatement = z.literal(true, {
  error: "Confirm that you have read the statement and that it is your own.",
});

/**
 * The engineer signs a release: the name typed as signed, the licence number and the statement,
 * read and confirmed. The server adds the time and the sha256 of the pour's report at signing.
 */
export const releaseSchema = z.strictObject({
  statement: reasonText("release statement"),
  signerName: text({ error: "Type your name as you sign." })
    .trim()
    .min(2, "Type your name as you sign.")
    .max(120, "Use at most 120 characters."),
  licence: text({ error: "Type your licence number." })
    .trim()
    .min(3, "Type your licence number (e.g. PE 012345, State of …).")
    .max(160, "Use at most 160 characters."),
  confirmed: confirmedStatement,
});
export type ReleaseInput = z.infer<typeof releaseSchema>;

/** Reopening a released pour: the engineer's reason, read and confirmed like a release. */
export const reopenSchema = z.strictObject({
  reason: reasonText("reason for reopening the pour"),
  confirmed: confirmedStatement,
});

export const correctionParamsSchema = z.object({
  projectId: z.uuid({ error: "Not a project id." }),
  recordId: z.uuid({ error: "Not a record id." }),
});

/** A paperwork correction: the values that were written down wrong, and why. */
export const correctionSchema = z
  .strictObject({
    reason: reasonText("reason for the correction"),
    measuredMm: z.number().positive("The elongation must be above zero.").max(5000).optional(),
    finalPressureMPa: z.number().positive("The gauge pressure must be above zero.").max(200).optional(),
    initialPressureMPa: z.number().min(0).max(200).nullable().optional(),
    tendonEnd: z.enum(TENDON_ENDS).optional(),
  })
  .refine(
    (v) =>
      v.measuredMm !== undefined ||
      v.finalPressureMPa !== undefined ||
      v.initialPressureMPa !== undefined ||
      v.tendonEnd !== undefined,
    {
      message: "Change at least one value.",
      path: ["measuredMm"],
    },
  );
export type CorrectionInput = z.infer<typeof correctionSchema>;

export const flagFilterSchema = z.object({
  projectId: z.uuid().optional(),
  pourId: z.uuid().optional(),
  // Every kind there is, so the list to filter by never misses one.
  kind: z.enum(FLAG_KINDS).optional(),
  olderThanHours: z.coerce
    .number()
    .int()
    .min(0)
    .max(24 * 365)
    .optional(),
  status: z.enum(["open", "with_engineer", "any_open"]).default("any_open"),
});
export type FlagFilter = z.infer<typeof flagFilterSchema>;
