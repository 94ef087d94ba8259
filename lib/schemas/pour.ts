import type { Selectable } from "kysely";
import { z } from "zod";
import type { PoursTable } from "@/db/types";
import type { PourStatus } from "./domain";
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

/**
 * A pour as every reader gets it (the tablet's pull and pour list, the office's pour list, the
 * stressing report): the one DTO, made from a row by `pourFromRow` only. Its status is derived
 * (the `pour_states` view): read it beside the columns (`.select([...qualified("pours",
 * POUR_COLUMNS), "pour_states.status"])`).
 */
export interface Pour {
  id: string;
  projectId: string;
  name: string;
  level: string | null;
  areaM2: number | null;
  /** YYYY-MM-DD. */
  plannedStressingDate: string | null;
  /** The confirmed concrete strength (MPa) from the lab's results, null until confirmed. */
  concreteStrengthMPa: number | null;
  /** Planned, stressing, stressed or released: from the records and the release. */
  status: PourStatus;
}

/** The columns of `pours` that `pourFromRow` reads, beside `pour_states.status`. */
export const POUR_COLUMNS = [
  "id",
  "project_id",
  "name",
  "level",
  "area_m2",
  "planned_stressing_date",
  "concrete_strength_mpa",
] as const satisfies readonly (keyof PoursTable)[];

export type PourRow = Pick<Selectable<PoursTable>, (typeof POUR_COLUMNS)[number]> & { status: PourStatus };

export function pourFromRow(row: PourRow): Pour {
  return {
    id: row.id,
    projectId: row.project_id,
    name: row.name,
    level: row.level,
    areaM2: row.area_m2,
    plannedStressingDate: row.planned_stressing_date,
    concreteStrengthMPa: row.concrete_strength_mpa,
    status: row.status,
  };
}
