import "server-only";
import { sql, type Kysely } from "kysely";
import type { Database } from "@/db/types";

/**
 * Ends every session a person has open, on every device: raises their session version, and every
 * authorized call refuses a session cookie minted under an older one (lib/server/load-session-user.ts).
 * Called on sign-out, password reset, removal from a project and a role change.
 */
export async function endSessions(db: Kysely<Database>, userId: string): Promise<void> {
  await db
    .updateTable("users")
    .set({ session_version: sql`session_version + 1` })
    .where("id", "=", userId)
    .execute();
}
