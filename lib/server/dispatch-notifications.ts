import "server-only";
import { sql, type Kysely } from "kysely";
import type { Database } from "@/db/types";
import { sendMail, type OutgoingMail } from "@/lib/mail/send-mail";
import { backoffDelayMs } from "@/lib/retry/backoff";

/**
 * Sends what the notifications outbox holds. Each row is claimed, sent and marked in its own
 * short transaction (FOR UPDATE SKIP LOCKED, so two dispatchers never take the same row). A
 * dispatcher that dies before its commit leaves the row pending for the next one; the only
 * window for a second copy is between the SMTP server's "250 OK" and our commit. Failures retry
 * with exponential backoff and jitter; after MAX_ATTEMPTS a row is marked failed.
 */

export const MAX_ATTEMPTS = 10;

/** 5 s doubling to half an hour, at least half of each step waited (lib/retry/backoff). */
const MAIL_BACKOFF = { baseMs: 5_000, capMs: 30 * 60_000, jitter: 0.5 } as const;

export type Send = (mail: OutgoingMail & { messageId: string }) => Promise<void>;

const defaultSend: Send = (mail) => sendMail(mail);

export async function dispatchOne(
  db: Kysely<Database>,
  send: Send = defaultSend,
): Promise<"sent" | "retry" | "failed" | "idle"> {
  return db.transaction().execute(async (trx) => {
    const row = await trx
      .selectFrom("notifications")
      .select(["id", "to_emails", "subject", "text_body", "html_body", "attempts"])
      .where("status", "=", "pending")
      .where("next_attempt_at", "<=", sql<Date>`now()`)
      .orderBy("next_attempt_at")
      .limit(1)
      .forUpdate()
      .skipLocked()
      .executeTakeFirst();
    if (!row) return "idle";
    try {
      await send({
        to: row.to_emails,
        subject: row.subject,
        text: row.text_body,
        html: row.html_body,
        messageId: `<${row.id}@notifications.tautline>`,
      });
    } catch (error) {
      const attempts = row.attempts + 1;
      const failed = attempts >= MAX_ATTEMPTS;
      await trx
        .updateTable("notifications")
        .set({
          attempts,
          status: failed ? "failed" : "pending",
          last_error: String(error instanceof Error ? error.message : error).slice(0, 500),
          next_attempt_at: new Date(Date.now() + backoffDelayMs(attempts, MAIL_BACKOFF)),
        })
        .where("id", "=", row.id)
        .execute();
      return failed ? "failed" : "retry";
    }
    await trx
      .updateTable("notifications")
      .set({ status: "sent", sent_at: new Date(), attempts: row.attempts + 1, last_error: null })
      .where("id", "=", row.id)
      .execute();
    return "sent";
  });
}

/** Sends everything due now; returns how many rows were sent. */
export async function drainNotifications(db: Kysely<Database>, send: Send = defaultSend, limit = 200): Promise<number> {
  let sent = 0;
  for (let i = 0; i < limit; i++) {
    const outcome = await dispatchOne(db, send);
    if (outcome === "idle") break;
    if (outcome === "sent") sent++;
  }
  return sent;
}
