import "server-only";
import { sql, type Kysely } from "kysely";
import type { Database } from "@/db/types";

/** At most this many reset or sign-in-link e-mails go to one address in an hour. */
export const MAILS_PER_ADDRESS_PER_HOUR = 3;

/**
 * Whether another e-mail of this kind may go to this address now: counts the ones sent in the
 * last hour from the audit log (each send is audited with outcome "success"), so nobody can
 * flood an inbox through the reset or sign-in-link forms.
 */
export async function allowMailToAddress(
  db: Kysely<Database>,
  input: { action: "password.reset-request" | "sign-in.link-requested"; email: string },
): Promise<boolean> {
  const row = await db
    .selectFrom("audit_events")
    .select(sql<number>`count(*)::int`.as("n"))
    .where("action", "=", input.action)
    .where("outcome", "=", "success")
    .where("actor_email", "=", input.email.toLowerCase())
    .where("at", ">", sql<Date>`now() - interval '1 hour'`)
    .executeTakeFirstOrThrow();
  return row.n < MAILS_PER_ADDRESS_PER_HOUR;
}
