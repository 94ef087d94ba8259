import { z } from "zod";
import { text } from "./text";

/** What the inspector types to sign a report: their name, licence or certification, and the statement. */
export const reportSignatureSchema = z.strictObject({
  signerName: text().trim().min(2, "Type your name as you sign.").max(120, "Use at most 120 characters."),
  licence: text()
    .trim()
    .min(3, "Type your licence or certification number (e.g. ICC special inspector 1234567).")
    .max(160, "Use at most 160 characters."),
  statement: text()
    .trim()
    .min(20, "Write the statement you sign, at least a sentence.")
    .max(2000, "Use at most 2,000 characters."),
});
export type ReportSignatureInput = z.infer<typeof reportSignatureSchema>;

export const DEFAULT_POUR_STATEMENT =
  "I inspected the stressing of the tendons listed in this report. To the best of my knowledge the work was completed in conformance with the approved construction documents, except as noted in the flags and dispositions.";

export const signedRevisionParamsSchema = z.object({
  projectId: z.uuid({ error: "Not a project id." }),
  pourId: z.uuid({ error: "Not a pour id." }),
  revision: z.coerce
    .number({ error: "Not a revision number." })
    .int("Not a revision number.")
    .min(1, "Not a revision number.")
    .max(100_000, "Not a revision number."),
});

/** A report file's sha256, computed in the browser from the file the reader holds. */
export const reportVerificationSchema = z.strictObject({
  sha256: z
    .string()
    .trim()
    .toLowerCase()
    .regex(/^[0-9a-f]{64}$/, "Give the file's sha256 as 64 hexadecimal characters."),
});
