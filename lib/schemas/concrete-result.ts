import { z } from "zod";
import { CONCRETE_SPECIMENS } from "./domain";

export const concreteResultParamsSchema = z.object({
  projectId: z.uuid({ error: "Not a project id." }),
  pourId: z.uuid({ error: "Not a pour id." }),
});

/** One set of specimens broken by the lab, in SI (the form converts psi first). */
export const concreteResultSchema = z.strictObject({
  specimen: z.enum(CONCRETE_SPECIMENS, { error: "Say whether the specimens are cylinders or cubes." }),
  strengthMPa: z
    .number({ error: "Enter the strength." })
    .positive("The strength must be above zero.")
    .max(200, "That is stronger than any structural concrete (at most 200 MPa)."),
  ageDays: z
    .number({ error: "Enter the age at test in days." })
    .int("Enter the age in whole days.")
    .min(0, "The age cannot be negative.")
    .max(365, "Enter an age of at most 365 days."),
  specimenCount: z
    .number({ error: "Enter how many specimens were broken." })
    .int("Enter a whole number of specimens.")
    .min(1, "At least one specimen.")
    .max(50, "At most 50 specimens in one set."),
  attachmentId: z.uuid({ error: "Upload the lab report again." }).nullable().optional(),
});
export type ConcreteResultInput = z.infer<typeof concreteResultSchema>;
