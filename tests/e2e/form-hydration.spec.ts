import { expect, test, type Page } from "@playwright/test";
import { demoProjectId, makeCalibratedSet } from "./pour-fixture";
import { PEOPLE, apiAs, signInWithPassword } from "./people";
import { screenshot } from "./support";

/**
 * Every client form keeps its controls disabled until the page's script has run (`ClientForm`,
 * components/ui/client-form.tsx): before that a choice would be set back by hydration and a press
 * would send the form the browser's own way. The page's script is held back here, so the page
 * stands as the server drew it for as long as the test looks at it; then it is let through.
 */
const stamp = Date.now().toString(36);

/** Holds every script chunk of the app until the returned function is called. */
async function holdScripts(page: Page): Promise<() => void> {
  let release: () => void = () => {};
  const released = new Promise<void>((resolve) => (release = resolve));
  await page.route("**/_next/static/chunks/**", async (route) => {
    await released;
    await route.continue();
  });
  return release;
}

test("the sign-in form is disabled until the page's script runs, then signs in", async ({ page }) => {
  const release = await holdScripts(page);
  // The chunks load asynchronously: the document is parsed and painted without them.
  await page.goto("/sign-in", { waitUntil: "domcontentloaded" });
  const gate = page.locator("form > fieldset");
  await expect(gate).toHaveCount(1);
  await expect(gate).toHaveAttribute("disabled", "");
  await expect(page.getByLabel("E-mail")).toBeDisabled();
  await expect(page.getByLabel("Password")).toBeDisabled();
  await expect(page.getByRole("button", { name: "Sign in", exact: true })).toBeDisabled();
  await expect(page.getByRole("button", { name: "E-mail me a sign-in link" })).toBeDisabled();
  await screenshot(page, "sign-in-before-script");

  release();
  await expect(gate).not.toHaveAttribute("disabled");
  await expect(page.getByLabel("E-mail")).toBeEnabled();
  await expect(page.getByRole("button", { name: "Sign in", exact: true })).toBeEnabled();
  await page.getByLabel("E-mail").fill(PEOPLE.admin);
  await page.getByLabel("Password").fill("tautline-demo");
  await page.getByRole("button", { name: "Sign in", exact: true }).click();
  await page.waitForURL(/\/(home|setup)/);
});

test("the add-calibration form is disabled until the page's script runs, and a set chosen after stays chosen", async ({
  page,
}) => {
  const projectId = await demoProjectId();
  const admin = await apiAs(PEOPLE.admin);
  // A set of this spec's own, so the choice is not the first set of the list.
  const setName = `Zz hydration set ${stamp}`;
  const { setId } = await makeCalibratedSet(
    admin,
    projectId,
    { name: setName, jackSerial: `HJ-${stamp}`, gaugeSerial: `HG-${stamp}` },
    "2026-11-01",
  );
  await admin.dispose();

  await page.setViewportSize({ width: 1440, height: 900 });
  await signInWithPassword(page, PEOPLE.admin);
  await page.waitForURL(/\/(home|setup)/);

  const release = await holdScripts(page);
  await page.goto(`/projects/${projectId}/equipment`, { waitUntil: "domcontentloaded" });
  const form = page.getByRole("form", { name: "Add a calibration" });
  const gate = form.locator("> fieldset");
  await expect(gate).toHaveAttribute("disabled", "");
  const set = form.getByLabel("Equipment set");
  await expect(set).toBeDisabled();
  await expect(set).not.toHaveValue(setId);
  await expect(form.getByLabel("Calibrated on")).toBeDisabled();
  await expect(form.getByRole("button", { name: "Save calibration" })).toBeDisabled();
  // The other forms of the page wait the same way.
  await expect(page.locator("form > fieldset:not([disabled])")).toHaveCount(0);

  release();
  await expect(gate).not.toHaveAttribute("disabled");
  await expect(set).toBeEnabled();
  await set.selectOption({ label: setName });
  await expect(set).toHaveValue(setId);
  await expect(page.locator("form > fieldset[disabled]")).toHaveCount(0);
  await screenshot(page, "equipment-after-script");
});
