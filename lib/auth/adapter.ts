import "server-only";
import type { Adapter, AdapterUser } from "next-auth/adapters";
import type { Db } from "@/db/connect";

/**
 * The part of a next-auth adapter that e-mail sign-in links need, on Tautline's own users table.
 * Sessions are JWTs, so no session methods. Sign-in links never create accounts: people join
 * a project through an invitation, so createUser refuses.
 */
export function tautlineAdapter(db: Db): Adapter {
  const toAdapterUser = (u: { id: string; email: string; name: string; email_verified: Date | null }): AdapterUser => ({
    id: u.id,
    email: u.email,
    name: u.name,
    emailVerified: u.email_verified,
  });
  const userColumns = ["id", "email", "name", "email_verified"] as const;

  return {
    async createUser() {
      throw new Error("Accounts are created through invitations, not by sign-in links.");
    },
    async getUser(id) {
      const u = await db
        .selectFrom("users")
        .select(userColumns)
        .where("id", "=", id)
        .where("is_active", "=", true)
        .executeTakeFirst();
      return u ? toAdapterUser(u) : null;
    },
    async getUserByEmail(email) {
      const u = await db
        .selectFrom("users")
        .select(userColumns)
        .where("email", "=", email.toLowerCase())
        .where("is_active", "=", true)
        .executeTakeFirst();
      return u ? toAdapterUser(u) : null;
    },
    async getUserByAccount() {
      return null;
    },
    async updateUser(user) {
      const u = await db
        .updateTable("users")
        .set({ ...(user.emailVerified ? { email_verified: user.emailVerified } : {}), updated_at: new Date() })
        .where("id", "=", user.id)
        .returning(userColumns)
        .executeTakeFirstOrThrow();
      return toAdapterUser(u);
    },
    async linkAccount() {
      return undefined;
    },
    async createVerificationToken(token) {
      await db.insertInto("verification_tokens").values(token).execute();
      return token;
    },
    async useVerificationToken({ identifier, token }) {
      const used = await db
        .deleteFrom("verification_tokens")
        .where("identifier", "=", identifier)
        .where("token", "=", token)
        .returning(["identifier", "token", "expires"])
        .executeTakeFirst();
      return used ?? null;
    },
  };
}
