import "server-only";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import EmailProvider from "next-auth/providers/email";
import { z } from "zod";
import { db } from "@/db";
import { env } from "@/lib/env";
import { sendMail } from "@/lib/mail/send-mail";
import { signInLinkMail } from "@/lib/mail/templates";
import { recordAudit } from "@/lib/server/record-audit";
import { tautlineAdapter } from "./adapter";
import { verifyPassword } from "./passwords";
import { clearFailedSignIns, countFailedSignIn, isSignInPaused } from "./rate-limit";

const LINK_MINUTES = 15;

const credentialsSchema = z.object({
  email: z.string().trim().toLowerCase().pipe(z.email()),
  password: z.string().min(1).max(200),
});

function requestIp(headers: Record<string, string | string[] | undefined> | undefined): string {
  const value = headers?.["x-forwarded-for"];
  const first = (Array.isArray(value) ? value[0] : value)?.split(",")[0]?.trim();
  return first || "unknown";
}

/**
 * next-auth options, in one module so the route handler and getServerSession share them.
 * The JWT carries only the user id; roles and the active flag are read from the database on
 * every authorized call (lib/auth/session.ts), so a removed member loses access at once.
 */
export const authOptions: NextAuthOptions = {
  secret: env.NEXTAUTH_SECRET,
  adapter: tautlineAdapter(db),
  session: { strategy: "jwt", maxAge: 12 * 60 * 60 },
  pages: { signIn: "/sign-in", verifyRequest: "/sign-in/check-email", error: "/sign-in" },
  providers: [
    CredentialsProvider({
      id: "credentials",
      name: "E-mail and password",
      credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
      async authorize(raw, req) {
        const parsed = credentialsSchema.safeParse(raw);
        if (!parsed.success) return null;
        const { email, password } = parsed.data;
        const ip = requestIp(req?.headers);

        if (await isSignInPaused(email, ip)) {
          await recordAudit(db, {
            action: "sign-in.password",
            outcome: "denied",
            actorEmail: email,
            ip,
            detail: { reason: "paused" },
          });
          return null;
        }
        const user = await db
          .selectFrom("users")
          .select(["id", "email", "name", "password_hash", "is_active"])
          .where("email", "=", email)
          .executeTakeFirst();
        const ok = (await verifyPassword(password, user?.password_hash)) && user?.is_active === true;
        if (!ok || !user) {
          await countFailedSignIn(email, ip);
          await recordAudit(db, {
            action: "sign-in.password",
            outcome: "failure",
            actorUserId: user?.id,
            actorEmail: email,
            ip,
          });
          return null;
        }
        await clearFailedSignIns(email);
        await recordAudit(db, {
          action: "sign-in.password",
          outcome: "success",
          actorUserId: user.id,
          actorEmail: email,
          ip,
        });
        return { id: user.id, email: user.email, name: user.name };
      },
    }),
    EmailProvider({
      maxAge: LINK_MINUTES * 60,
      from: env.MAIL_FROM,
      // Sent only to active accounts; the page says "check your inbox" either way, so the
      // answer never tells whether an address has an account.
      async sendVerificationRequest({ identifier, url }) {
        const email = identifier.toLowerCase();
        const user = await db
          .selectFrom("users")
          .select("id")
          .where("email", "=", email)
          .where("is_active", "=", true)
          .executeTakeFirst();
        await recordAudit(db, {
          action: "sign-in.link-requested",
          outcome: user ? "success" : "failure",
          actorUserId: user?.id,
          actorEmail: email,
        });
        if (!user) return;
        await sendMail(signInLinkMail({ to: email, url, minutes: LINK_MINUTES }));
      },
    }),
  ],
  callbacks: {
    async signIn({ user, account, email }) {
      if (account?.provider !== "email" || email?.verificationRequest) return true;
      // The link was used: accept it only for an active account.
      const found = await db
        .selectFrom("users")
        .select("id")
        .where("id", "=", user.id)
        .where("is_active", "=", true)
        .executeTakeFirst();
      await recordAudit(db, {
        action: "sign-in.link",
        outcome: found ? "success" : "failure",
        actorUserId: found?.id,
        actorEmail: user.email ?? null,
      });
      return Boolean(found);
    },
    async jwt({ token, user }) {
      if (user) token.sub = user.id;
      return token;
    },
    async session({ session, token }) {
      return { ...session, user: { ...session.user, id: token.sub ?? "" } };
    },
  },
};
