import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Page } from "@playwright/test";
import { PEOPLE, queryDemo, signInWithPassword } from "./people";

/** Automated accessibility checks (axe-core, WCAG 2 A and AA rules) on the main screens. */

async function expectNoSeriousViolations(page: Page, where: string) {
  const results = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa"]).analyze();
  const serious = results.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id}: ${v.help} (${v.nodes.length}× e.g. ${v.nodes[0]?.target.join(" ")})`);
  expect(serious, `${where}\n${serious.join("\n")}`).toEqual([]);
}

/** Every violation axe finds (any impact), for the office screens, which must have none. */
async function expectNoViolations(page: Page, where: string) {
  const results = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"]).analyze();
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

test("the landing and sign-in pages pass", async ({ page }) => {
  await page.goto("/");
  await expectNoSeriousViolations(page, "landing");
  await page.goto("/sign-in");
  await expectNoSeriousViolations(page, "sign-in");
});

test("the inspector's and the engineer's screens pass", async ({ page }) => {
  await signInWithPassword(page, PEOPLE.engineer);
  await page.waitForURL(/\/home$/);
  await expectNoSeriousViolations(page, "engineer home");
  await page.goto("/review");
  await expectNoSeriousViolations(page, "review queue");
  await page.getByRole("link", { name: "Tendon 2-2-U17" }).click();
  await expect(page.getByRole("heading", { name: "1. Inputs" })).toBeVisible();
  await expectNoSeriousViolations(page, "tendon flags");
  await page.goto("/decisions");
  await expectNoSeriousViolations(page, "decisions");
});

test("the crew's field log passes", async ({ page }) => {
  await signInWithPassword(page, PEOPLE.crew);
  await page.waitForURL(/\/home$/);
  await expectNoSeriousViolations(page, "crew home");
  await page.goto("/field");
  await expect(page.getByRole("heading", { name: "Field log", level: 1 })).toBeVisible();
  // The screen itself, not its placeholder: it loads with the tablet's database after the first paint.
  await expect(page.getByRole("heading", { name: "Ready offline", level: 2 })).toBeVisible();
  await expectNoSeriousViolations(page, "field log");
});
