import { z } from "zod";
import { text } from "./text";

/** Longest a read-only link may live before it must be made again. */
export const MAX_SHARE_DAYS = 180;

/** A read-only link to the project's status board for the general contractor or the building official. */
export const shareLinkSchema = z.strictObject({
  label: text()
    .trim()
    .min(2, "Say who the link is for (e.g. the general contractor).")
    .max(120, "Use at most 120 characters."),
  days: z
    .number({ error: "Give how many days the link works." })
    .int("Give whole days.")
    .min(1, "A link works for at least one day.")
    .max(MAX_SHARE_DAYS, `A link works for at most ${MAX_SHARE_DAYS} days; make a new one after.`),
});
export type ShareLinkInput = z.infer<typeof shareLinkSchema>;

export const shareLinkParamsSchema = z.object({
  projectId: z.uuid({ error: "Not a project id." }),
  linkId: z.uuid({ error: "Not a link id." }),
});

/** The token of a shared link as it appears in the address (43 characters of base64url). */
export const shareTokenSchema = z.string().regex(/^[A-Za-z0-9_-]{43}$/, "Not a valid link.");

export const sharedReportParamsSchema = z.object({
  token: shareTokenSchema,
  pourId: z.uuid({ error: "Not a pour id." }),
  revision: z.coerce.number({ error: "Not a revision number." }).int().min(1).max(100_000),
});
