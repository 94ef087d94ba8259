import { z } from "zod";

/** How a member takes the project's flag e-mails: one per flag, or one digest per shift. */
export const flagMailModeSchema = z.enum(["each", "digest"], {
  error: "Pick one e-mail per flag or one digest per shift.",
});

export const flagMailSchema = z.strictObject({ mode: flagMailModeSchema });

export type FlagMailMode = z.infer<typeof flagMailModeSchema>;
