import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";

/** Whether a pour or a tendon with this id is on this project: the check behind a page's 404. */
export async function existsInProject(
  db: Kysely<Database>,
  input: { projectId: string; table: "pours" | "tendons"; id: string },
): Promise<boolean> {
  const row = await db
    .selectFrom(input.table)
    .select("id")
    .where("project_id", "=", input.projectId)
    .where("id", "=", input.id)
    .executeTakeFirst();
  return row !== undefined;
}
