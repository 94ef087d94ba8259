import { z } from "zod";
import { text } from "./text";

export const pourSchema = z.strictObject({
  name: text().trim().min(1, "Give the pour a name, as on the drawings.").max(80, "Use at most 80 characters."),
  level: text().trim().max(80, "Use at most 80 characters.").nullable(),
  areaM2: z
    .number({ error: "Give the area as a number." })
    .positive("The area must be above 0.")
    .max(100_000, "That area looks too large.")
    .nullable(),
  plannedStressingDate: z.iso.date({ error: "Give the date as YYYY-MM-DD." }).nullable(),
  status: z.never({ error: "A pour's status follows from its records and its release; it cannot be set." }).optional(),
});
export type PourInput = z.infer<typeof pourSchema>;

export const pourParamsSchema = z.object({
  projectId: z.uuid({ error: "Not a project id." }),
  pourId: z.uuid({ error: "Not a pour id." }),
});
