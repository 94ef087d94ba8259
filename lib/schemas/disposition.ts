import type { Selectable } from "kysely";
import type { DispositionsTable } from "@/db/types";
import { reference } from "@/lib/format/references";
import type { Decision } from "./domain";

/**
 * The engineer's decision on a flag as every reader gets it (the tablet's pull, the tendon's flag
 * trail, the stressing report, the crew's notice): the one DTO, made from a row by
 * `dispositionFromRow` only. Instants as ISO text.
 */
export interface Disposition {
  id: string;
  /** Its number in the project as people cite it ("D-0007"). */
  reference: string;
  projectId: string;
  flagId: string;
  tendonId: string;
  decision: Decision;
  reasons: string;
  engineerUserId: string;
  /** The engineer's name and licence statement as signed. */
  engineerName: string;
  licenceStatement: string;
  createdAt: string;
}

/** The columns `dispositionFromRow` reads: select these (`.select(DISPOSITION_COLUMNS)`). */
export const DISPOSITION_COLUMNS = [
  "id",
  "number",
  "project_id",
  "flag_id",
  "tendon_id",
  "decision",
  "reasons",
  "engineer_user_id",
  "engineer_name",
  "licence_statement",
  "created_at",
] as const satisfies readonly (keyof DispositionsTable)[];

/** A dispositions row as read directly (the instant as Date) or out of a JSON aggregate (as text). */
export type DispositionRow = Omit<
  Pick<Selectable<DispositionsTable>, (typeof DISPOSITION_COLUMNS)[number]>,
  "created_at"
> & {
  created_at: Date | string;
};

export function dispositionFromRow(row: DispositionRow): Disposition {
  return {
    id: row.id,
    reference: reference("D", Number(row.number)),
    projectId: row.project_id,
    flagId: row.flag_id,
    tendonId: row.tendon_id,
    decision: row.decision,
    reasons: row.reasons,
    engineerUserId: row.engineer_user_id,
    engineerName: row.engineer_name,
    licenceStatement: row.licence_statement,
    createdAt: new Date(row.created_at).toISOString(),
  };
}
