import { expect, test, type Locator, type Page } from "@playwright/test";
import { queryDemo } from "./people";
import { makePourFixture, typedReading } from "./pour-fixture";
import { screenshot } from "./support";
import { openPourAsCrew } from "./field-steps";

/**
 * One tendon end on one screen: on a landscape (1280×800) and a portrait (800×1280) tablet the
 * record form, the readings and Save sit inside the viewport with the page unscrolled, every
 * target is glove-sized and every box's text at least 16 px; on a tendon's second end the hold
 * and the verdict so far stay on screen beside the form. The pour is made for this spec.
 */

const stamp = Date.now().toString(36);
const POUR = `One screen ${stamp}`;
const SIZES = [
  { name: "landscape", width: 1280, height: 800 },
  { name: "portrait", width: 800, height: 1280 },
] as const;

/** The element lies wholly inside the viewport of an unscrolled page. */
async function expectOnScreen(page: Page, target: Locator, what: string) {
  expect(await page.evaluate(() => window.scrollY), "the page is not scrolled").toBe(0);
  const box = await target.boundingBox();
  const view = page.viewportSize()!;
  expect(box, `${what} is shown`).not.toBeNull();
  expect(box!.y, `${what}: top inside the screen`).toBeGreaterThanOrEqual(0);
  expect(box!.x, `${what}: left inside the screen`).toBeGreaterThanOrEqual(0);
  expect(box!.y + box!.height, `${what}: bottom inside the ${view.height} px screen`).toBeLessThanOrEqual(view.height);
  expect(box!.x + box!.width, `${what}: right inside the ${view.width} px screen`).toBeLessThanOrEqual(view.width);
  // Wholly seen, not cut off by a column that scrolls on its own.
  await expect(target, `${what} is wholly seen`).toBeInViewport({ ratio: 1 });
}

/** Every button, box and chip of the form is at least 48 px high and wide; boxes type at 16 px or more. */
async function expectGloveSized(form: Locator) {
  const targets = form.locator(
    "button:visible, input:visible:not([type=radio]), textarea:visible, label:has(input[type=radio])",
  );
  const count = await targets.count();
  expect(count).toBeGreaterThan(10);
  for (let i = 0; i < count; i++) {
    const box = await targets.nth(i).boundingBox();
    const name = (await targets.nth(i).textContent()) || (await targets.nth(i).getAttribute("id"));
    expect(box!.height, `height of ${name}`).toBeGreaterThanOrEqual(48);
    expect(box!.width, `width of ${name}`).toBeGreaterThanOrEqual(48);
  }
  const sizes = await form
    .locator("input:visible, textarea:visible")
    .evaluateAll((boxes) => boxes.map((b) => parseFloat(getComputedStyle(b).fontSize)));
  expect(sizes.length).toBeGreaterThan(3);
  for (const px of sizes) expect(px).toBeGreaterThanOrEqual(16);
}

test("one tendon end and Save fit on one tablet screen in both orientations, with the hold and verdict beside", async ({
  browser,
}) => {
  test.setTimeout(120_000);
  const fx = await makePourFixture(POUR, [`OS-${stamp}-1`, `OS-${stamp}-2`]);
  const [fresh, twoEnd] = fx.tendons as [(typeof fx.tendons)[number], (typeof fx.tendons)[number]];
  await queryDemo("update tendons set ends = 'both' where id = $1", [twoEnd.id]);
  const [set] = await queryDemo<{ name: string }>("select name from equipment_sets where id = $1", [fx.setId]);

  const ctx = await browser.newContext({ viewport: { width: 1280, height: 800 }, hasTouch: true });
  const page = await ctx.newPage();
  await openPourAsCrew(page, POUR);

  // A tendon with nothing recorded: the whole form, its readings and Save on the first screen.
  await page.getByTestId("tendon-row").filter({ hasText: fresh.tag }).click();
  const form = page.getByTestId("record-form");
  const save = page.getByRole("button", { name: "Save record" });
  for (const size of SIZES) {
    await page.setViewportSize(size);
    await page.evaluate(() => window.scrollTo(0, 0));
    await expect(form).toBeVisible();
    await expectOnScreen(page, page.getByLabel(/Final gauge pressure/), "the final pressure box");
    await expectOnScreen(page, page.getByLabel(/Mark after/), "the mark-after box");
    await expectOnScreen(page, save, "Save");
    // The whole form, not only a Save that sticks to the bottom edge.
    await expectOnScreen(page, form, "the record form");
    await expectGloveSized(form);
    await screenshot(page, `field-record-one-screen-${size.name}`);
  }
  // Portrait folded the list away; it comes back with one tap.
  await page.getByRole("button", { name: /Change tendon/ }).click();
  await expect(page.getByTestId("tendon-row").filter({ hasText: twoEnd.tag })).toBeVisible();
  await page.getByTestId("tendon-row").filter({ hasText: twoEnd.tag }).click();
  await expect(page.getByTestId("tendon-list")).toBeHidden();
  await page.setViewportSize(SIZES[0]);

  // End A of the two-end tendon, read a quarter long, the fraction from the keys.
  const reading = typedReading(fx, 1.25);
  const [whole, fraction] = reading.after.split(" ");
  await page.getByRole("radio", { name: new RegExp(set!.name) }).check();
  await page.getByLabel(/Final gauge pressure/).fill(reading.psi);
  await page.getByLabel(/Mark before/).fill(reading.before);
  const markAfter = page.getByLabel(/Mark after/);
  await markAfter.fill(whole!);
  // The keys write into the box last touched, and a second key replaces the first fraction.
  const keys = page.getByTestId("fraction-keys");
  await expect(keys).toContainText("Mark after");
  await keys.getByRole("button", { name: "1/8", exact: true }).click();
  await expect(markAfter).toHaveValue(`${whole} 1/8`);
  if (fraction) await keys.getByRole("button", { name: fraction, exact: true }).click();
  else await markAfter.fill(reading.after);
  await expect(markAfter).toHaveValue(reading.after);
  await save.click();
  await expect(page.getByTestId("verdict").locator("[data-verdict]").first()).toContainText("Long");
  // The band as the tape reads it on this 1/8 in project: fractions, and no decimals for a reading on the division.
  await expect(page.getByTestId("band")).toHaveText(/^\d+( \d\/\d)? in to \d+( \d\/\d)? in$/);
  await expect(page.getByTestId("band-decimals")).toHaveCount(0);

  // End B next: the hold, the verdict so far and the whole form on one screen.
  await expect(page.getByRole("radio", { name: "End B" })).toBeChecked();
  for (const size of SIZES) {
    await page.setViewportSize(size);
    await page.evaluate(() => window.scrollTo(0, 0));
    await expectOnScreen(page, page.getByTestId("hold-panel").getByRole("heading"), "the hold's heading");
    await expectOnScreen(page, page.getByTestId("verdict").locator("[data-verdict]").first(), "the verdict");
    await expectOnScreen(page, form, "the record form");
    await expectOnScreen(page, save, "Save");
    await screenshot(page, `field-record-second-end-${size.name}`);
  }

  // Storage the browser will not protect (headless Chromium refuses): the bar says what that means for unsent records.
  await page.setViewportSize(SIZES[0]);
  const storage = page.getByTestId("storage");
  await expect(storage).toContainText("not protected");
  await storage.click();
  const help = page.getByTestId("storage-help");
  await expect(help).toContainText("may clear it without asking");
  await expect(help).toBeInViewport({ ratio: 1 });
  await expect(help).toContainText(/not sent yet would be lost|every record saved so far is on the server/);
  await help.getByRole("button", { name: "Ask the browser again" }).click();
  await expect(help.getByRole("status")).toContainText(/The browser (now protects|refused again)/);
  await screenshot(page, "field-storage-not-protected");
  await help.getByRole("button", { name: "Close" }).click();
  await expect(help).toHaveCount(0);
  await ctx.close();
});
