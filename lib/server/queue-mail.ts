import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import type { OutgoingMail } from "@/lib/mail/send-mail";

/**
 * Puts one e-mail in the notifications queue for the dispatcher to send. The dedupe key names what
 * the mail is about: a second mail with the same key is not queued. Answers whether this one was.
 */
export async function queueMail(
  db: Kysely<Database>,
  input: { projectId: string; flagId: string | null; dedupeKey: string; to: string[]; mail: OutgoingMail },
): Promise<boolean> {
  const row = await db
    .insertInto("notifications")
    .values({
      project_id: input.projectId,
      flag_id: input.flagId,
      dedupe_key: input.dedupeKey,
      to_emails: input.to,
      subject: input.mail.subject,
      text_body: input.mail.text,
      html_body: input.mail.html,
    })
    .onConflict((oc) => oc.column("dedupe_key").doNothing())
    .returning("id")
    .executeTakeFirst();
  return row !== undefined;
}
