import type { Db } from "@/db/connect";

/** The local mail fake's inbox (scripts/fakes.ts), as the integration tests read it. */
export const INBOX = process.env.MAIL_INBOX_URL ?? "http://127.0.0.1:1081";

/** How many messages with this subject the mail fake has caught. */
export async function inboxCount(subject: string): Promise<number> {
  const list = (await (await fetch(`${INBOX}/api/messages`)).json()) as { subject: string }[];
  return list.filter((m) => m.subject === subject).length;
}

/**
 * An e-mail queued for the dispatcher on the project, to the demo engineer, deduplicated by its
 * subject; its body says `body` (by default "Body of <subject>"). `values` sets other columns
 * (a flag, a status, when it was made). Its id.
 */
export async function queueMail(
  db: Db,
  projectId: string,
  subject: string,
  body = `Body of ${subject}`,
  values: { flag_id?: string; status?: "failed"; last_error?: string; created_at?: Date } = {},
): Promise<string> {
  const row = await db
    .insertInto("notifications")
    .values({
      project_id: projectId,
      dedupe_key: `test:${subject}`,
      to_emails: ["engineer@demo.tautline.test"],
      subject,
      text_body: body,
      html_body: `<p>${body}</p>`,
      ...values,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  return row.id;
}
