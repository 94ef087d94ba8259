import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Page } from "@playwright/test";
import { PEOPLE, signInWithPassword } from "./people";

/** Automated accessibility checks (axe-core, WCAG 2 A and AA rules) on the main screens. */

async function expectNoSeriousViolations(page: Page, where: string) {
  const results = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa"]).analyze();
  const serious = results.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id}: ${v.help} (${v.nodes.length}× e.g. ${v.nodes[0]?.target.join(" ")})`);
  expect(serious, `${where}\n${serious.join("\n")}`).toEqual([]);
}

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
  await expectNoSeriousViolations(page, "field log");
});
