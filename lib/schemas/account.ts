import { z } from "zod";
import { text } from "./text";

export const emailSchema = text({ error: "Enter an e-mail address." })
  .trim()
  .toLowerCase()
  .pipe(z.email({ error: "Enter an e-mail address like name@company.com." }))
  .refine((v) => v.length <= 254, "That e-mail address is too long.");

export const passwordSchema = text({ error: "Enter a password." })
  .min(10, "Use at least 10 characters.")
  .max(200, "Use at most 200 characters.");

export const personNameSchema = text({ error: "Enter your name." })
  .trim()
  .min(2, "Enter your name as it should appear on records.")
  .max(120, "Use at most 120 characters.");

export const tokenSchema = text().regex(
  /^[A-Za-z0-9_-]{20,100}$/,
  "This link is not complete; open it from the e-mail again.",
);

export const acceptInvitationSchema = z.strictObject({
  token: tokenSchema,
  name: personNameSchema.optional(),
  password: passwordSchema.optional(),
});

export const passwordResetRequestSchema = z.strictObject({ email: emailSchema });

export const passwordResetSchema = z.strictObject({ token: tokenSchema, password: passwordSchema });
