import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { projectTimeZone } from "@/lib/format/dates";

/** The zone a project's dates are shown in, for pages that have no project row of their own at hand. */
export async function getProjectTimeZone(db: Kysely<Database>, projectId: string): Promise<string> {
  const row = await db.selectFrom("projects").selectAll().where("id", "=", projectId).executeTakeFirst();
  return projectTimeZone(row ?? {});
}
