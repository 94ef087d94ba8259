import { z } from "zod";
import { latestDayAnywhere } from "@/lib/format/dates";
import { reportSignatureSchema } from "./report-signature";
import { text } from "./text";

/**
 * The daily special-inspection report: a project and a calendar day in the project's time zone.
 * A day that has not begun anywhere on Earth has nothing to report and is refused.
 */
export const reportDaySchema = z.iso
  .date({ error: "Give the day as YYYY-MM-DD." })
  .refine((day) => day >= "2000-01-01", "Give a day from 2000 on.")
  .refine((day) => day <= latestDayAnywhere(), "That day has not begun yet; pick today or an earlier day.");

export const dailyReportParamsSchema = z.object({
  projectId: z.uuid({ error: "Not a project id." }),
  day: reportDaySchema,
});

export const dailyRevisionParamsSchema = dailyReportParamsSchema.extend({
  revision: z.coerce
    .number({ error: "Not a revision number." })
    .int("Not a revision number.")
    .min(1, "Not a revision number.")
    .max(100_000, "Not a revision number."),
});

/** How much of a pour's (or a group's) stressing of the day the inspector states was witnessed. */
export const WITNESS_EXTENTS = ["full", "part", "none"] as const;
export type WitnessExtent = (typeof WITNESS_EXTENTS)[number];
export const WITNESS_WORDS: Record<WitnessExtent, string> = {
  full: "witnessed in full",
  part: "witnessed in part",
  none: "not witnessed",
};

/** Whether the work inspected that day was in conformance with the approved construction documents. */
export const CONFORMANCE = ["conforming", "not_conforming"] as const;
export type Conformance = (typeof CONFORMANCE)[number];

/**
 * One witness statement: the stressing of a pour's group of tendons on the day (the schedule's
 * member, a beam, slab strip or band; "" for the pour's tendons with no member named), how much of it
 * was witnessed, by whom, and which part or why not.
 */
export const witnessEntrySchema = z
  .object({
    pourId: z.uuid({ error: "Not a pour id." }),
    group: text().trim().max(120, "Use at most 120 characters."),
    extent: z.enum(WITNESS_EXTENTS, { error: "Choose witnessed in full, in part, or not witnessed." }),
    witnessedBy: text().trim().max(120, "Use at most 120 characters."),
    note: text().trim().max(500, "Use at most 500 characters."),
  })
  .superRefine((w, ctx) => {
    if (w.extent !== "none" && w.witnessedBy.length < 2)
      ctx.addIssue({ code: "custom", path: ["witnessedBy"], message: "Name who witnessed it." });
    if (w.extent === "part" && w.note.length < 3)
      ctx.addIssue({ code: "custom", path: ["note"], message: "Say which part was witnessed (tendons or ends)." });
    if (w.extent === "none" && w.note.length < 3)
      ctx.addIssue({ code: "custom", path: ["note"], message: "Say why it was not witnessed." });
  });
export type WitnessEntry = z.infer<typeof witnessEntrySchema>;

/** What the inspector attests on the day's report; kept with the signed revision. */
export interface DailyAttestation {
  conformance: Conformance;
  witness: WitnessEntry[];
}

/**
 * What the inspector types to sign the day's report: their name, licence or certification, the
 * statement, the remarks the report prints (what they saw that the records do not say), whether the
 * work was in conformance (chosen, never assumed) and what was witnessed of each pour or group
 * stressed that day. Remarks, conformance and witness are part of the signed content: changing them
 * gives a new revision. The server checks the witness list against the day (every group once).
 */
export const dailySignatureSchema = reportSignatureSchema.extend({
  remarks: text().trim().max(4000, "Use at most 4,000 characters in the remarks."),
  conformance: z.enum(CONFORMANCE, {
    error: "Choose whether the work was in conformance or not in conformance.",
  }),
  witness: z.array(witnessEntrySchema, { error: "List what was witnessed." }).max(500, "At most 500 groups."),
});
export type DailySignatureInput = z.infer<typeof dailySignatureSchema>;

export const DEFAULT_DAILY_STATEMENT =
  "I performed the special inspection of post-tensioning described in this report on this day, to the extent stated under what was witnessed. My statement of conformance is given in this report.";
