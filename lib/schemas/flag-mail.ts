import { z } from "zod";
import { FLAG_MAIL_MODES } from "./domain";

/** How a member takes the project's flag e-mails: one per flag, or one digest per shift. */
export const flagMailModeSchema = z.enum(FLAG_MAIL_MODES, {
  error: "Pick one e-mail per flag or one digest per shift.",
});

export const flagMailSchema = z.strictObject({ mode: flagMailModeSchema });
