import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";

/**
 * The pour's release that stands now: the latest one the engineer has not reopened, or undefined.
 * A pour released, reopened and released again has two releases; the reopened one is history.
 * The same rule as the pour_states view.
 */
export async function findStandingRelease(db: Kysely<Database>, input: { projectId: string; pourId: string }) {
  return db
    .selectFrom("releases")
    .select(["id", "released_by_name", "statement", "created_at", "signer_name", "licence", "content_sha256"])
    .where("project_id", "=", input.projectId)
    .where("pour_id", "=", input.pourId)
    .where(({ not, exists, selectFrom }) =>
      not(
        exists(selectFrom("pour_reopenings").select("id").whereRef("pour_reopenings.release_id", "=", "releases.id")),
      ),
    )
    .orderBy("created_at", "desc")
    .orderBy("id", "desc")
    .limit(1)
    .executeTakeFirst();
}
