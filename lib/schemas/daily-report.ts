import { z } from "zod";
import { latestDayAnywhere } from "@/lib/format/dates";
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

/**
 * What the inspector types to sign the day's report: their name, licence or certification, the
 * statement of conformance, and the remarks the report prints (what they saw that the records do
 * not say). The remarks are part of the signed content: changing them gives a new revision.
 */
export const dailySignatureSchema = z.strictObject({
  signerName: text().trim().min(2, "Type your name as you sign.").max(120, "Use at most 120 characters."),
  licence: text()
    .trim()
    .min(3, "Type your licence or certification number (e.g. ICC special inspector 1234567).")
    .max(160, "Use at most 160 characters."),
  statement: text()
    .trim()
    .min(20, "Write the statement you sign, at least a sentence.")
    .max(2000, "Use at most 2,000 characters."),
  remarks: text().trim().max(4000, "Use at most 4,000 characters in the remarks."),
});
export type DailySignatureInput = z.infer<typeof dailySignatureSchema>;

export const DEFAULT_DAILY_STATEMENT =
  "I performed the special inspection of post-tensioning described in this report on this day. Except as noted in the flags, dispositions and remarks, the work I inspected was in conformance with the approved construction documents.";
