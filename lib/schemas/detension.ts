import type { Selectable } from "kysely";
import { z } from "zod";
import type { DetensionsTable } from "@/db/types";
import { text } from "./text";

/**
 * A detension as the tablet's outbox sends it (op kind detension; the op's recordId is the
 * detension's id), answering the engineer's disposition that ordered it (decision
 * detension_restress): when the strands were released, who ran the jack, with which equipment
 * set, the gauge pressure at release when it was read (exactly as typed, with the unit a bare
 * number is read in), how many strands were released, and remarks. The person signed in on the
 * tablet is who recorded it.
 */
export const detensionPayloadSchema = z
  .object({
    projectId: z.uuid({ error: "Name the project." }),
    pourId: z.uuid({ error: "Name the pour." }),
    tendonId: z.uuid({ error: "Name the tendon." }),
    dispositionId: z.uuid({ error: "Name the engineer's disposition that ordered the detension." }),
    detensionedAt: z.iso.datetime({ offset: true, error: "The time of the detension must be an ISO date and time." }),
    operatorName: text({ error: "Type who ran the jack." })
      .trim()
      .min(2, "Type who ran the jack (at least 2 characters).")
      .max(80, "Keep the operator's name under 80 characters."),
    equipmentSetId: z.uuid({ error: "Choose the equipment set used." }),
    pressure: text({ error: "The gauge pressure at release must be text." })
      .trim()
      .max(40, "Keep the gauge pressure at release under 40 characters.")
      .optional(),
    pressureUnit: z.enum(["psi", "MPa"], { error: "The pressure unit must be psi or MPa." }),
    strandsDetensioned: z
      .number({ error: "Type how many strands were detensioned." })
      .int("Type a whole number of strands.")
      .min(1, "At least one strand is detensioned.")
      .max(100, "A tendon has at most 100 strands."),
    remarks: text({ error: "Remarks must be text." })
      .trim()
      .max(1000, "Keep the remarks under 1000 characters.")
      .optional(),
    authorUserId: z.uuid({ error: "Name the person who recorded the detension." }),
  })
  .strict();
export type DetensionPayload = z.infer<typeof detensionPayloadSchema>;

/**
 * A detension as the crew reported it, as every reader gets it (the tablet's pull, the tendon's
 * review page, the stressing report): the one DTO, made from a row by `detensionFromRow` only.
 */
export interface Detension {
  id: string;
  projectId: string;
  pourId: string;
  tendonId: string;
  /** The disposition that ordered it. */
  dispositionId: string;
  /** ISO instant the strands were released. */
  detensionedAt: string;
  /** Who ran the jack. */
  operatorName: string;
  equipmentSetId: string;
  /** The gauge pressure at release as typed, null when it was not read. */
  entered: { pressure: string; unit: "psi" | "MPa" } | null;
  releasePressureMPa: number | null;
  strandsDetensioned: number;
  remarks: string | null;
  /** The person signed in on the tablet. */
  recordedByName: string;
}

/** The columns of `detensions` that `detensionFromRow` reads, beside `users.name as recorded_by_name`. */
export const DETENSION_COLUMNS = [
  "id",
  "project_id",
  "pour_id",
  "tendon_id",
  "disposition_id",
  "detensioned_at",
  "operator_name",
  "equipment_set_id",
  "entered",
  "release_pressure_mpa",
  "strands_detensioned",
  "remarks",
] as const satisfies readonly (keyof DetensionsTable)[];

export type DetensionRow = Omit<
  Pick<Selectable<DetensionsTable>, (typeof DETENSION_COLUMNS)[number]>,
  "detensioned_at"
> & {
  detensioned_at: Date | string;
  recorded_by_name: string;
};

export function detensionFromRow(row: DetensionRow): Detension {
  return {
    id: row.id,
    projectId: row.project_id,
    pourId: row.pour_id,
    tendonId: row.tendon_id,
    dispositionId: row.disposition_id,
    detensionedAt: new Date(row.detensioned_at).toISOString(),
    operatorName: row.operator_name,
    equipmentSetId: row.equipment_set_id,
    entered: row.entered,
    releasePressureMPa: row.release_pressure_mpa,
    strandsDetensioned: row.strands_detensioned,
    remarks: row.remarks,
    recordedByName: row.recorded_by_name,
  };
}
