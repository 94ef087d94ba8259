import type { Selectable } from "kysely";
import { z } from "zod";
import type { StrandLotsTable } from "@/db/types";
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

/**
 * A strand lot as every reader gets it (the tablet's pull, the lot list, the stressing report, the
 * tendon's basis): the one DTO, made from a row by `strandLotFromRow` only. SI, as certified.
 */
export interface StrandLot {
  id: string;
  projectId: string;
  lotNumber: string;
  strandSize: string;
  areaMm2: number;
  modulusMPa: number;
  breakingLoadN: number;
}

/** The columns `strandLotFromRow` reads: select these (`.select(STRAND_LOT_COLUMNS)`). */
export const STRAND_LOT_COLUMNS = [
  "id",
  "project_id",
  "lot_number",
  "strand_size",
  "area_mm2",
  "modulus_mpa",
  "breaking_load_n",
] as const satisfies readonly (keyof StrandLotsTable)[];

export type StrandLotRow = Pick<Selectable<StrandLotsTable>, (typeof STRAND_LOT_COLUMNS)[number]>;

export function strandLotFromRow(row: StrandLotRow): StrandLot {
  return {
    id: row.id,
    projectId: row.project_id,
    lotNumber: row.lot_number,
    strandSize: row.strand_size,
    areaMm2: row.area_mm2,
    modulusMPa: row.modulus_mpa,
    breakingLoadN: row.breaking_load_n,
  };
}
