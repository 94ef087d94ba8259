import { expect, test } from "@playwright/test";
import { screenshot } from "./support";
import { PEOPLE, signInWithPassword } from "./people";

/**
 * The README's walk through the demo job: each person signs in and reaches their main task in
 * a few clicks. The screenshots land in test-results/screens/tour-*.png.
 */

const nav = (page: import("@playwright/test").Page, name: string) =>
  page.getByRole("navigation", { name: "Main" }).getByRole("link", { name, exact: true }).click();

test.describe("the demo job, as each person", () => {
  test("the admin finds today's pour and its tendon schedule", async ({ page }) => {
    await signInWithPassword(page, PEOPLE.admin);
    await page.waitForURL(/\/home$/);
    await screenshot(page, "tour-admin-home");
    await nav(page, "Project setup");
    await page.getByRole("link", { name: "Pours and tendons" }).first().click();
    await page.getByRole("link", { name: "L2 Pour 2", exact: true }).click();
    await expect(page.getByText("2-2-U01").first()).toBeVisible();
    await screenshot(page, "tour-admin-schedule");
  });

  test("the crew opens the field log", async ({ page }) => {
    await signInWithPassword(page, PEOPLE.crew);
    await page.waitForURL(/\/home$/);
    await expect(page.getByRole("heading", { name: "Pours stressing today" })).toBeVisible();
    await screenshot(page, "tour-crew-home");
    await nav(page, "Field log");
    await expect(page.getByRole("heading", { name: "Field log", level: 1 })).toBeVisible();
    // Last week's pour is released, and the crew can see it.
    await expect(
      page.getByTestId("available-pour").filter({ hasText: "L2 Pour 1" }).getByTestId("pour-released"),
    ).toBeVisible();
    await screenshot(page, "tour-crew-field");
  });

  test("the inspector opens the newest out-of-band tendon", async ({ page }) => {
    await signInWithPassword(page, PEOPLE.inspector);
    await page.waitForURL(/\/home$/);
    await screenshot(page, "tour-inspector-home");
    await nav(page, "Flags to review");
    await expect(page.getByRole("link", { name: "Tendon 2-2-U08" })).toBeVisible();
    await screenshot(page, "tour-inspector-queue");
    await page.getByRole("link", { name: "Tendon 2-2-U08" }).click();
    await expect(page.getByRole("heading", { name: "Tendon 2-2-U08", level: 1 })).toBeVisible();
    await expect(page.locator("[data-verdict=short]").first()).toBeVisible();
    await screenshot(page, "tour-inspector-flag");
  });

  test("the engineer reads the calculation behind a restress order and sees what holds the pour", async ({ page }) => {
    await signInWithPassword(page, PEOPLE.engineer);
    await page.waitForURL(/\/home$/);
    await screenshot(page, "tour-engineer-home");
    await nav(page, "Decisions");
    await expect(page.locator('[data-pour="L2 Pour 1"]')).toContainText("Released by");
    await screenshot(page, "tour-engineer-decisions");
    await page.getByRole("link", { name: "Tendon 2-2-U17" }).click();
    await expect(page.getByText("Disposition: Restress")).toBeVisible();
    await expect(page.getByRole("heading", { name: "2. Friction, segment by segment" })).toBeVisible();
    await screenshot(page, "tour-engineer-flag");
  });
});
