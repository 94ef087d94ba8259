import "server-only";
import type { Db } from "@/db/connect";
import { hashPassword } from "@/lib/auth/passwords";
import { hashToken, newToken } from "@/lib/auth/tokens";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { sendMail } from "@/lib/mail/send-mail";
import { passwordResetMail } from "@/lib/mail/templates";
import { recordAudit } from "./record-audit";

const RESET_MINUTES = 30;

/** Sends a reset link when the address has an active account; says nothing either way. */
export async function requestPasswordReset(db: Db, input: { email: string; ip: string }): Promise<void> {
  const user = await db
    .selectFrom("users")
    .select("id")
    .where("email", "=", input.email)
    .where("is_active", "=", true)
    .executeTakeFirst();
  await recordAudit(db, {
    action: "password.reset-request",
    outcome: user ? "success" : "failure",
    actorUserId: user?.id,
    actorEmail: input.email,
    ip: input.ip,
  });
  if (!user) return;
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
