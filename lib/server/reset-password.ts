import "server-only";
import type { Db } from "@/db/connect";
import { hashPassword } from "@/lib/auth/passwords";
import { hashToken, newToken } from "@/lib/auth/tokens";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { sendMail } from "@/lib/mail/send-mail";
import { passwordResetMail } from "@/lib/mail/templates";
import { allowMailToAddress } from "./allow-mail-to-address";
import { endSessions } from "./end-sessions";
import { recordAudit } from "./record-audit";

const RESET_MINUTES = 30;

/**
 * Sends a reset link when the address has an active account; says nothing either way. The
 * route runs it in the background (runInBackground), so the answer takes the same time for an
 * address with or without an account; at most 3 links an hour go to one address.
 */
export async function requestPasswordReset(db: Db, input: { email: string; ip: string | null }): Promise<void> {
  const user = await db
    .selectFrom("users")
    .select("id")
    .where("email", "=", input.email)
    .where("is_active", "=", true)
    .executeTakeFirst();
  const allowed = user ? await allowMailToAddress(db, { action: "password.reset-request", email: input.email }) : false;
  await recordAudit(db, {
    action: "password.reset-request",
    outcome: user ? (allowed ? "success" : "denied") : "failure",
    actorUserId: user?.id,
    actorEmail: input.email,
    ip: input.ip,
    ...(user && !allowed ? { detail: { reason: "throttled" } } : {}),
  });
  if (!user || !allowed) return;
  const { token, hash } = newToken();
  await db
    .insertInto("password_resets")
    .values({ user_id: user.id, token_hash: hash, expires_at: new Date(Date.now() + RESET_MINUTES * 60_000) })
    .execute();
  await sendMail(
    passwordResetMail({ to: input.email, url: `${env.APP_URL}/reset-password/${token}`, minutes: RESET_MINUTES }),
  );
}

/** Uses a reset link once and sets the new password. */
export async function resetPassword(db: Db, input: { token: string; password: string }): Promise<{ email: string }> {
  const passwordHash = await hashPassword(input.password);
  return db.transaction().execute(async (trx) => {
    const reset = await trx
      .updateTable("password_resets")
      .set({ used_at: new Date() })
      .where("token_hash", "=", hashToken(input.token))
      .where("used_at", "is", null)
      .where("expires_at", ">", new Date())
      .returning("user_id")
      .executeTakeFirst();
    if (!reset) throw new AppError("GONE", "This reset link has expired or was already used. Ask for a new one.");
    const user = await trx
      .updateTable("users")
      .set({ password_hash: passwordHash, updated_at: new Date() })
      .where("id", "=", reset.user_id)
      .where("is_active", "=", true)
      .returning("email")
      .executeTakeFirst();
    if (!user) throw new AppError("GONE", "This account is switched off. Ask the project admin.");
    // Sessions opened before the reset end: whoever knew the old password is signed out.
    await endSessions(trx, reset.user_id);
    // Every other open link for this account stops working too.
    await trx
      .updateTable("password_resets")
      .set({ used_at: new Date() })
      .where("user_id", "=", reset.user_id)
      .where("used_at", "is", null)
      .execute();
    await recordAudit(trx, {
      action: "password.reset",
      outcome: "success",
      actorUserId: reset.user_id,
      actorEmail: user.email,
    });
    return { email: user.email };
  });
}
