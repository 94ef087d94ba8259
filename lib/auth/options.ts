import "server-only";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import EmailProvider from "next-auth/providers/email";
import { z } from "zod";
import { db } from "@/db";
import { env } from "@/lib/env";
import { clientAddress } from "@/lib/http/client-address";
import { sendMail } from "@/lib/mail/send-mail";
import { signInLinkMail } from "@/lib/mail/templates";
import { allowMailToAddress } from "@/lib/server/allow-mail-to-address";
import { endSessions } from "@/lib/server/end-sessions";
import { recordAudit } from "@/lib/server/record-audit";
import { runInBackground } from "@/lib/server/run-in-background";
import { tautlineAdapter } from "./adapter";
import { verifyPassword } from "./passwords";
import { clearFailedSignIns, countFailedSignIn, isSignInPaused } from "./rate-limit";

const LINK_MINUTES = 15;

const credentialsSchema = z.object({
  email: z.string().trim().toLowerCase().pipe(z.email()),
  password: z.string().min(1).max(200),
});

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
        const ip = clientAddress(req?.headers);

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
        // In the background, so the answer takes the same time whether or not the account exists.
        runInBackground("sign-in-link", async () => {
          const email = identifier.toLowerCase();
          const user = await db
            .selectFrom("users")
            .select("id")
            .where("email", "=", email)
            .where("is_active", "=", true)
            .executeTakeFirst();
          const allowed = user ? await allowMailToAddress(db, { action: "sign-in.link-requested", email }) : false;
          await recordAudit(db, {
            action: "sign-in.link-requested",
            outcome: user ? (allowed ? "success" : "denied") : "failure",
            actorUserId: user?.id,
            actorEmail: email,
          });
          if (!user || !allowed) return;
          await sendMail(signInLinkMail({ to: email, url, minutes: LINK_MINUTES }));
        });
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
      if (user) {
        token.sub = user.id;
        // The session version at sign-in; a later sign-out, reset, removal or role change raises it.
        const row = await db.selectFrom("users").select("session_version").where("id", "=", user.id).executeTakeFirst();
        token.sv = row?.session_version ?? 0;
      }
      return token;
    },
    async session({ session, token }) {
      return {
        ...session,
        user: { ...session.user, id: token.sub ?? "", sessionVersion: typeof token.sv === "number" ? token.sv : 0 },
      };
    },
  },
  events: {
    // Signing out ends the person's sessions everywhere, so a copied cookie dies with it.
    async signOut({ token }) {
      const id = token?.sub;
      if (!id) return;
      await endSessions(db, id);
      await recordAudit(db, { action: "sign-out", outcome: "success", actorUserId: id });
    },
  },
};
