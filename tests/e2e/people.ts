import { request as playwrightRequest, type APIRequestContext, type Page } from "@playwright/test";
import pg from "pg";
import { assertLocalDatabase } from "../support/local-database";

export const BASE_URL = process.env.E2E_BASE_URL ?? "http://localhost:3100";
export const INBOX_URL = process.env.MAIL_INBOX_URL ?? "http://127.0.0.1:1081";
export const DEMO_PASSWORD = "tautline-demo";

export const PEOPLE = {
  admin: "admin@demo.tautline.test",
  crew: "crew@demo.tautline.test",
  inspector: "inspector@demo.tautline.test",
  engineer: "engineer@demo.tautline.test",
  other: "crew@other.tautline.test",
} as const;
export type Person = keyof typeof PEOPLE;

/** An API client signed in through next-auth's own credentials endpoint, sending our Origin. */
export async function apiAs(email: string | null, password = DEMO_PASSWORD): Promise<APIRequestContext> {
  const ctx = await playwrightRequest.newContext({ baseURL: BASE_URL, extraHTTPHeaders: { Origin: BASE_URL } });
  if (!email) return ctx;
  const { csrfToken } = (await (await ctx.get("/api/auth/csrf")).json()) as { csrfToken: string };
  const res = await ctx.post("/api/auth/callback/credentials", {
    form: { csrfToken, email, password, json: "true", callbackUrl: `${BASE_URL}/home` },
  });
  if (!res.ok()) throw new Error(`sign-in of ${email} answered ${res.status()}`);
  const me = await ctx.get("/api/me");
  if (me.status() !== 200) throw new Error(`sign-in of ${email} did not give a session (me: ${me.status()})`);
  return ctx;
}

export async function signInWithPassword(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in", exact: true }).click();
}

interface CaughtMail {
  id: number;
  to: string[];
  subject: string;
  text: string;
  html: string;
}

/**
 * Waits for the newest message to an address in the local mail fake (that `match` accepts, when
 * given: other specs' e-mails can arrive in between) and returns it.
 */
export async function latestMailTo(
  address: string,
  after = 0,
  timeoutMs = 15_000,
  match: (mail: CaughtMail) => boolean = () => true,
): Promise<CaughtMail> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const res = await fetch(`${INBOX_URL}/api/messages?to=${encodeURIComponent(address)}`);
    const list = (await res.json()) as CaughtMail[];
    const newest = list.filter((m) => m.id > after && match(m)).at(-1);
    if (newest) return newest;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`no mail to ${address} arrived within ${timeoutMs} ms`);
}

export async function lastMailId(): Promise<number> {
  const list = (await (await fetch(`${INBOX_URL}/api/messages`)).json()) as CaughtMail[];
  return list.at(-1)?.id ?? 0;
}

export function linkIn(mail: CaughtMail, path: string): string {
  const match = new RegExp(`https?://[^\\s"<>]+${path.replace(/[/]/g, "\\/")}[^\\s"<>]*`).exec(mail.text);
  if (!match) throw new Error(`no ${path} link in "${mail.subject}"`);
  return match[0];
}

/**
 * Reads the seeded demo straight from the app's database (the e2e run's throwaway one), and writes
 * the rows a spec makes for itself; refuses a database that is not on loopback.
 */
export async function queryDemo<T extends Record<string, unknown>>(text: string, values: unknown[] = []): Promise<T[]> {
  assertLocalDatabase(process.env.DATABASE_URL, "DATABASE_URL");
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await client.connect();
  try {
    return (await client.query<T>(text, values)).rows;
  } finally {
    await client.end();
  }
}

export async function pourIdByName(name: string): Promise<string> {
  const rows = await queryDemo<{ id: string }>(
    "select pours.id from pours join projects on projects.id = pours.project_id where projects.code = 'AYP' and pours.name = $1",
    [name],
  );
  if (!rows[0]) throw new Error(`demo pour ${name} not found`);
  return rows[0].id;
}
