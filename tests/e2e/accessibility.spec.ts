import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Page } from "@playwright/test";
import { PEOPLE, apiAs, lastMailId, latestMailTo, linkIn, queryDemo, signInWithPassword } from "./people";
import { screenshot } from "./support";

/** Automated accessibility checks (axe-core, WCAG 2 A and AA rules) on the main screens. */

/**
 * Every violation axe finds (any impact): no page may have one. `bestPractice` adds axe's
 * best-practice rules (one main landmark, content inside landmarks, heading order…).
 */
async function expectNoViolations(page: Page, where: string, bestPractice = false) {
  const tags = ["wcag2a", "wcag2aa", "wcag21a", "wcag21aa", ...(bestPractice ? ["best-practice"] : [])];
  const results = await new AxeBuilder({ page }).withTags(tags).analyze();
  const found = results.violations.map(
    (v) => `${v.id} (${v.impact}): ${v.help} (${v.nodes.length}× e.g. ${v.nodes[0]?.target.join(" ")})`,
  );
  expect(found, `${where}\n${found.join("\n")}`).toEqual([]);
}

test("every office page has no axe violation at all, charts included", async ({ page }) => {
  test.setTimeout(180_000);
  const [project] = await queryDemo<{ id: string }>("select id from projects where code = 'AYP'");
  const [pour] = await queryDemo<{ id: string }>("select id from pours where project_id = $1 and name = 'L2 Pour 2'", [
    project!.id,
  ]);
  const [tendon] = await queryDemo<{ id: string }>("select id from tendons where project_id = $1 and tag = '2-2-U17'", [
    project!.id,
  ]);
  const [lot] = await queryDemo<{ id: string }>("select id from strand_lots where project_id = $1 limit 1", [
    project!.id,
  ]);
  const base = `/projects/${project!.id}`;

  await signInWithPassword(page, PEOPLE.admin);
  await page.waitForURL(/\/home$/);
  for (const path of [
    "/home",
    "/setup",
    `${base}/setup`,
    `${base}/pours`,
    `${base}/pours/${pour!.id}`,
    `${base}/tendons/${tendon!.id}`,
    `${base}/strand-lots`,
    `${base}/strand-lots?edit=${lot!.id}`,
    `${base}/equipment`,
    `${base}/members`,
    `${base}/pours/${pour!.id}/insight`,
  ]) {
    await page.goto(path);
    await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
    await page.waitForLoadState("networkidle");
    await expectNoViolations(page, `admin ${path}`);
  }
  await page.context().clearCookies();

  await signInWithPassword(page, PEOPLE.engineer);
  await page.waitForURL(/\/home$/);
  for (const path of [
    "/home",
    "/review",
    `${base}/tendons/${tendon!.id}/flags`,
    "/decisions",
    `${base}/pours/${pour!.id}/insight`,
    `${base}/pours/00000000-0000-4000-8000-000000000000/insight`,
  ]) {
    await page.goto(path);
    await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
    await page.waitForLoadState("networkidle");
    await expectNoViolations(page, `engineer ${path}`);
  }
});

/**
 * The desktop (1440×900) and the tablet (1280×800) picture of a page, each checked by axe at that
 * size, best practice (landmarks, heading order) included.
 */
async function checkAtBothSizes(page: Page, name: string, where: string) {
  for (const size of [
    { width: 1440, height: 900 },
    { width: 1280, height: 800 },
  ]) {
    await page.setViewportSize(size);
    await expectNoViolations(page, `${where} at ${size.width}×${size.height}`, true);
    await page.evaluate(() => window.scrollTo(0, 0));
    await screenshot(page, `a11y-${name}-${size.width}`);
  }
}

test("the project's daily report, flag e-mail and read-only link screens have no violation", async ({ page }) => {
  const [project] = await queryDemo<{ id: string }>("select id from projects where code = 'AYP'");
  const base = `/projects/${project!.id}`;
  await signInWithPassword(page, PEOPLE.admin);
  await page.waitForURL(/\/home$/);
  for (const [name, path] of [
    ["daily", `${base}/daily`],
    ["flag-mail", `${base}/flag-mail`],
    ["share-links", `${base}/share`],
  ] as const) {
    await page.goto(path);
    await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
    await page.waitForLoadState("networkidle");
    await checkAtBothSizes(page, name, `admin ${path}`);
  }
});

test("the pages without an account have no violation: landing, sign-in, links, verification", async ({ page }) => {
  const [project] = await queryDemo<{ id: string }>("select id from projects where code = 'AYP'");
  // A read-only link and an invitation of this test's own, made through the API as the admin would.
  const admin = await apiAs(PEOPLE.admin);
  const made = await admin.post(`/api/projects/${project!.id}/share-links`, {
    data: { label: "Accessibility check", days: 1 },
  });
  expect(made.status()).toBe(201);
  const shareUrl = new URL(((await made.json()) as { url: string }).url);
  const email = `a11y-${Date.now()}@demo.tautline.test`;
  const before = await lastMailId();
  expect(
    (await admin.post(`/api/projects/${project!.id}/invitations`, { data: { email, role: "crew" } })).status(),
  ).toBe(201);
  const invitation = new URL(linkIn(await latestMailTo(email, before), "/invite/"));
  await admin.dispose();

  for (const [name, path, heading] of [
    ["landing", "/", null],
    ["sign-in", "/sign-in", null],
    ["check-email", "/sign-in/check-email", null],
    ["reset-password", "/reset-password", null],
    // The page is the same for any token; the token is only checked when the form is sent.
    ["reset-password-token", `/reset-password/${"x".repeat(43)}`, null],
    ["invite", invitation.pathname, /^Join /],
    ["share-board", shareUrl.pathname, /Alder Yard Parking \(AYP\)/],
    ["verify", "/verify", null],
    ["offline", "/offline", null],
  ] as const) {
    await page.goto(path);
    await expect(
      heading ? page.getByRole("heading", { level: 1, name: heading }) : page.getByRole("heading", { level: 1 }),
    ).toBeVisible();
    // The field shell keeps asking for the connection's state, so its pages never go quiet.
    if (name !== "offline") await page.waitForLoadState("networkidle");
    if (name === "landing" || name === "sign-in") await expectNoViolations(page, path);
    else await checkAtBothSizes(page, name, path);
  }
});

test("an unknown read-only link answers 404 with the not-found state inside the public layout", async ({ page }) => {
  const response = await page.goto(`/share/${"A".repeat(43)}`);
  expect(response?.status()).toBe(404);
  // The public layout's home link is still there around the state.
  await expect(page.getByRole("link", { name: "Tautline" })).toBeVisible();
  await expect(page.getByRole("heading", { level: 1 })).toHaveText("There is no read-only link at this address.");
  await checkAtBothSizes(page, "share-not-found", "unknown share link");
});

test("the inspector's and the engineer's screens pass", async ({ page }) => {
  await signInWithPassword(page, PEOPLE.engineer);
  await page.waitForURL(/\/home$/);
  await expectNoViolations(page, "engineer home");
  await page.goto("/review");
  await expectNoViolations(page, "review queue");
  await page.getByRole("link", { name: "Tendon 2-2-U17" }).click();
  await expect(page.getByRole("heading", { name: "1. Inputs" })).toBeVisible();
  await expectNoViolations(page, "tendon flags");
  await page.goto("/decisions");
  await expectNoViolations(page, "decisions");
});

test("the crew's field log, a pour's tendon list and the signing screen pass", async ({ page }) => {
  await signInWithPassword(page, PEOPLE.crew);
  await page.waitForURL(/\/home$/);
  await expectNoViolations(page, "crew home");
  await page.goto("/field");
  await expect(page.getByRole("heading", { name: "Field log", level: 1 })).toBeVisible();
  // The screen itself, not its placeholder: it loads with the tablet's database after the first paint.
  await expect(page.getByRole("heading", { name: "Ready offline", level: 2 })).toBeVisible();
  await expect(page.getByTestId("available-pour").first()).toBeVisible();
  await expectNoViolations(page, "field log");

  // Taking out a demo pour only reads it; its tendon list is then on the tablet.
  await page.getByTestId("available-pour").filter({ hasText: "L3 Pour 1" }).getByRole("button").click();
  const ready = page.getByTestId("ready-pour").filter({ hasText: "L3 Pour 1" });
  await expect(ready.getByTestId("ready-offline")).toBeVisible();
  await ready.getByRole("link", { name: "Open tendon list" }).click();
  await expect(page.getByTestId("tendon-row").first()).toBeVisible();
  await page.waitForLoadState("networkidle");
  await checkAtBothSizes(page, "field-pour", "field pour");
  await page.context().clearCookies();

  await signInWithPassword(page, PEOPLE.inspector);
  await page.waitForURL(/\/home$/);
  await page.goto("/field/sign");
  // The screen itself, not its same-headed placeholder.
  await expect(page.getByTestId("field-daily-state")).toBeVisible({ timeout: 30_000 });
  await checkAtBothSizes(page, "field-sign", "field sign");
});
