import { z } from "zod";
import { text } from "./text";
import { emailSchema } from "./account";
import { ROLES, UNIT_SYSTEMS } from "./domain";

export const roleSchema = z.enum(ROLES, {
  error: "Pick a role: crew, inspector, engineer or admin.",
});

export const projectParamsSchema = z.object({ projectId: z.uuid({ error: "Not a project id." }) });
export const memberParamsSchema = projectParamsSchema.extend({ userId: z.uuid({ error: "Not a person's id." }) });
export const invitationParamsSchema = projectParamsSchema.extend({
  invitationId: z.uuid({ error: "Not an invitation id." }),
});

export const inviteSchema = z.strictObject({ email: emailSchema, role: roleSchema });
export const changeRoleSchema = z.strictObject({ role: roleSchema });

export const createProjectSchema = z.strictObject({
  code: text()
    .trim()
    .toUpperCase()
    .regex(/^[A-Z0-9-]{2,12}$/, "Use 2 to 12 letters, digits or dashes."),
  name: text().trim().min(2, "Give the project a name.").max(160, "Use at most 160 characters."),
  unitSystem: z.enum(UNIT_SYSTEMS, { error: "Pick US customary or SI units." }).default("us"),
  firstAdminEmail: emailSchema,
});
