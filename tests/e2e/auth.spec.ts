import { expect, test } from "@playwright/test";
import { screenshot } from "./support";
import { PEOPLE, apiAs, lastMailId, latestMailTo, linkIn, queryDemo, signInWithPassword } from "./people";

const NAV_BY_PERSON = {
  crew: ["Today", "Field log"],
  inspector: ["Today", "Flags to review"],
  engineer: ["Today", "Flags to review", "Decisions"],
  admin: ["Today", "Project setup"],
  other: ["Today", "Field log"],
} as const;

test.describe("signing in", () => {
  for (const [person, nav] of Object.entries(NAV_BY_PERSON)) {
    test(`${person} signs in with a password and sees that role's navigation`, async ({ page }) => {
      await signInWithPassword(page, PEOPLE[person as keyof typeof PEOPLE]);
      await expect(page).toHaveURL(/\/home$/);
      await expect(page.getByRole("heading", { name: "Today", level: 1 })).toBeVisible();
      const links = page.getByRole("navigation", { name: "Main" }).getByRole("listitem");
      await expect(links).toHaveText([...nav]);
      await screenshot(page, `home-${person}`);
    });
  }

  test("Today reads what this tablet holds, and Sign out in the navigation ends the session", async ({ page }) => {
    // Both load code on demand (the tablet's database, next-auth's client): neither is in the first load.
    await signInWithPassword(page, PEOPLE.other);
    await expect(page.getByTestId("device-outbox")).toContainText("On this tablet: 0 records waiting to sync");
    await page.getByRole("navigation", { name: "Main" }).getByRole("button", { name: "Sign out" }).click();
    await expect(page).toHaveURL(/\/sign-in/);
    expect((await page.request.get("/api/me")).status()).toBe(401);
    await page.goto("/home");
    await expect(page).toHaveURL(/\/sign-in/);
  });

  test("a wrong password gets the generic message and no session", async ({ page }) => {
    await signInWithPassword(page, PEOPLE.crew, "not-the-password");
    await expect(page.locator('p[role="alert"]')).toContainText("did not open an account");
    await expect(page).toHaveURL(/\/sign-in/);
    // An address with no account gets exactly the same words.
    await signInWithPassword(page, "nobody-here@demo.tautline.test", "not-the-password");
    await expect(page.locator('p[role="alert"]')).toContainText("did not open an account");
    await screenshot(page, "sign-in-wrong-password");
    const me = await page.request.get("/api/me");
    expect(me.status()).toBe(401);
  });

  test("the one-time link from the e-mail signs in, once", async ({ page, browser }) => {
    const before = await lastMailId();
    await page.goto("/sign-in");
    await page.getByLabel("E-mail").fill(PEOPLE.inspector);
    await page.getByRole("button", { name: "E-mail me a sign-in link" }).click();
    await expect(page.getByRole("heading", { name: "Check your e-mail" })).toBeVisible();

    const mail = await latestMailTo(
      PEOPLE.inspector,
      before,
      15_000,
      (m) => m.subject === "Your Tautline sign-in link",
    );
    expect(mail.subject).toBe("Your Tautline sign-in link");
    expect(mail.html).toContain("Sign in");
    const link = linkIn(mail, "/api/auth/callback/email");
    await page.goto(link);
    await expect(page).toHaveURL(/\/home$/);
    await expect(page.getByTestId("signed-in-as")).toHaveText("Mei Lindqvist");

    // Used once: a second browser cannot use the same link.
    const other = await browser.newContext();
    const second = await other.newPage();
    await second.goto(link);
    await expect(second).toHaveURL(/\/sign-in/);
    await expect(second.locator('p[role="alert"]')).toContainText("expired or was already used");
    await other.close();
  });

  test("asking for a link for an unknown address looks the same and sends nothing", async ({ page }) => {
    const before = await lastMailId();
    await page.goto("/sign-in");
    await page.getByLabel("E-mail").fill("nobody-here@demo.tautline.test");
    await page.getByRole("button", { name: "E-mail me a sign-in link" }).click();
    await expect(page.getByRole("heading", { name: "Check your e-mail" })).toBeVisible();
    // Nothing goes to the unknown address (other e-mails may arrive meanwhile).
    await expect(latestMailTo("nobody-here@demo.tautline.test", before, 1500)).rejects.toThrow(/no mail/);
  });
});

test("an invitation is accepted end to end, and a removed member is refused at once", async ({ page, browser }) => {
  const newcomer = `newcomer-${Date.now()}@demo.tautline.test`;

  // The admin invites from the members screen.
  await signInWithPassword(page, PEOPLE.admin);
  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Project setup" }).click();
  await page.getByRole("link", { name: "People and invitations" }).first().click();
  await expect(page.getByRole("heading", { name: "People and invitations" })).toBeVisible();
  const before = await lastMailId();
  await page.getByLabel("E-mail", { exact: true }).fill(newcomer);
  await page.getByLabel("Role", { exact: true }).selectOption("admin");
  await page.getByRole("button", { name: "Send invitation" }).click();
  await expect(page.getByRole("status")).toContainText(`Invitation sent to ${newcomer}`);
  await expect(page.getByRole("listitem").filter({ hasText: newcomer })).toContainText("Project admin");
  await screenshot(page, "members-admin");

  // The newcomer opens the link from the e-mail in a browser of their own.
  const mail = await latestMailTo(newcomer, before);
  expect(mail.subject).toContain("Alder Yard Parking");
  const link = linkIn(mail, "/invite/");
  const theirs = await browser.newContext();
  const newcomerPage = await theirs.newPage();
  await newcomerPage.goto(link);
  await expect(newcomerPage.getByRole("heading", { name: "Join Alder Yard Parking" })).toBeVisible();
  await newcomerPage.getByRole("button", { name: "Accept and join" }).click();
  await expect(newcomerPage.locator("#name-error")).toHaveText("Enter your name as it should appear on records.");
  await expect(newcomerPage.locator("#password-error")).toContainText("at least 10 characters");
  await screenshot(newcomerPage, "invitation-accept-errors");
  await newcomerPage.getByLabel("Your name").fill("Noor Halvorsen");
  await newcomerPage.getByLabel(/Choose a password/).fill("a-long-enough-password");
  await newcomerPage.getByRole("button", { name: "Accept and join" }).click();
  await expect(newcomerPage).toHaveURL(/\/home$/);
  await expect(newcomerPage.getByText(/Alder Yard Parking/).first()).toBeVisible();

  // The link works once.
  const again = await (
    await apiAs(null)
  ).post("/api/invitations/accept", {
    data: { token: link.split("/invite/")[1], name: "Someone", password: "a-long-enough-password" },
  });
  expect(again.status()).toBe(410);

  // As a project admin the newcomer can read the member list...
  const me = (await (await newcomerPage.request.get("/api/me")).json()) as {
    id: string;
    memberships: { projectId: string }[];
  };
  const projectId = me.memberships[0]!.projectId;
  expect((await newcomerPage.request.get(`/api/projects/${projectId}/members`)).status()).toBe(200);

  // ...until the admin removes them: their session ends at once (same session cookie), so the
  // very next call is refused and the pages send them to sign in.
  await page.reload();
  await page.getByRole("button", { name: "Remove Noor Halvorsen" }).click();
  await page
    .getByRole("dialog", { name: "Remove Noor Halvorsen from the project?" })
    .getByRole("button", { name: "Remove Noor Halvorsen" })
    .click();
  await expect(page.getByRole("status")).toContainText("Noor Halvorsen was removed");
  expect((await newcomerPage.request.get(`/api/projects/${projectId}/members`)).status()).toBe(401);
  await newcomerPage.goto(`/projects/${projectId}/members`);
  await expect(newcomerPage).toHaveURL(/\/sign-in/);
  await theirs.close();
});

test("a password reset by e-mail sets a new password that then signs in", async ({ page }) => {
  const email = `reset-${Date.now()}@demo.tautline.test`;
  // A fresh person, so the demo passwords stay as documented.
  const admin = await apiAs(PEOPLE.admin);
  const me = (await (await admin.get("/api/me")).json()) as {
    memberships: { projectId: string; projectCode: string }[];
  };
  const projectId = me.memberships.find((m) => m.projectCode === "AYP")!.projectId;
  let before = await lastMailId();
  await admin.post(`/api/projects/${projectId}/invitations`, { data: { email, role: "crew" } });
  const token = linkIn(await latestMailTo(email, before), "/invite/").split("/invite/")[1];
  await admin.post("/api/invitations/accept", {
    data: { token, name: "Reset Person", password: "first-password-123" },
  });

  before = await lastMailId();
  await page.goto("/reset-password");
  await page.getByLabel("E-mail").fill(email);
  await page.getByRole("button", { name: "Send a reset link" }).click();
  await expect(page.getByRole("status")).toContainText("If this address has an account");
  await page.goto(linkIn(await latestMailTo(email, before), "/reset-password/"));
  await page.getByLabel(/New password/).fill("second-password-456");
  await page.getByRole("button", { name: "Save the new password" }).click();
  await expect(page).toHaveURL(/\/sign-in/);
  await signInWithPassword(page, email, "second-password-456");
  await expect(page).toHaveURL(/\/home$/);
  await admin.dispose();
});

test("after ten wrong passwords the account pauses, with the same words as any failure", async () => {
  const email = `paused-${Date.now()}@demo.tautline.test`;
  const admin = await apiAs(PEOPLE.admin);
  const me = (await (await admin.get("/api/me")).json()) as {
    memberships: { projectId: string; projectCode: string }[];
  };
  const projectId = me.memberships.find((m) => m.projectCode === "AYP")!.projectId;
  const before = await lastMailId();
  await admin.post(`/api/projects/${projectId}/invitations`, { data: { email, role: "crew" } });
  const token = linkIn(await latestMailTo(email, before), "/invite/").split("/invite/")[1];
  await admin.post("/api/invitations/accept", {
    data: { token, name: "Paused Person", password: "the-right-password-1" },
  });
  await admin.dispose();

  // Ten failures are allowed; the account limit is 10 in 15 minutes (lib/auth/rate-limit.ts).
  for (let i = 0; i < 10; i++) {
    await expect(apiAs(email, `wrong-password-${i}`)).rejects.toThrow(/answered 401|did not give a session/);
  }
  // Now even the right password is refused, with the same answer as a wrong one.
  await expect(apiAs(email, "the-right-password-1")).rejects.toThrow(/answered 401|did not give a session/);
  const [paused] = await queryDemo<{ n: number }>(
    "select count(*)::int as n from audit_events where actor_email = $1 and action = 'sign-in.password' and outcome = 'denied'",
    [email],
  );
  expect(paused!.n).toBe(1);
});
