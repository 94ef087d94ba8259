import { z } from "zod";
import { plainText, STRAND_SIZES } from "./tendon";

/** Mill-certificate values of one strand lot, in SI. */
export const strandLotSchema = z.strictObject({
  lotNumber: plainText("lot or heat number", 60),
  strandSize: z.enum(STRAND_SIZES, { error: `Pick a strand size: ${STRAND_SIZES.join(", ")}.` }),
  areaMm2: z
    .number({ error: "Give the area from the certificate." })
    .min(20, "That area is too small for strand.")
    .max(400, "That area is too large for one strand."),
  modulusMPa: z
    .number({ error: "Give the modulus from the certificate." })
    .min(150_000, "Below 150 GPa (21,800 ksi) is not strand.")
    .max(230_000, "Above 230 GPa (33,400 ksi) is not strand."),
  breakingLoadN: z
    .number({ error: "Give the breaking load from the certificate." })
    .min(50_000, "Below 50 kN (11 kip) is not strand.")
    .max(500_000, "Above 500 kN (112 kip) is not one strand."),
  certificateAttachmentId: z.uuid({ error: "Upload the mill certificate again." }).nullable(),
});
export type StrandLotInput = z.infer<typeof strandLotSchema>;

export const strandLotParamsSchema = z.object({
  projectId: z.uuid({ error: "Not a project id." }),
  strandLotId: z.uuid({ error: "Not a strand lot id." }),
});
