import { expect, test, type Browser, type Locator, type Page } from "@playwright/test";
import { PDFParse } from "pdf-parse";
import { makePourFixture, typedReading } from "./pour-fixture";
import { PEOPLE, lastMailId, latestMailTo, queryDemo, signInWithPassword } from "./people";
import { screenshot } from "./support";

/**
 * Tautline as its people use it, one pour from the slab edge to the signed report: the crew logs
 * a tendon end with no signal and a gauge photo, the signal comes back and the photo follows
 * later; the engineer of record gets the flag e-mail, opens the page it links to and orders a
 * restress; the crew's tablet shows the order after a sync, the restress comes in band, the
 * tendon turns clear and its tails are cut; the inspector signs the report and the PDF
 * downloads. Every screen visited is photographed (test-results/screens/walk-*.png) and read for
 * the same faults: raw ids, e-mail addresses where a person's name belongs, doubled words, the
 * browser's "Failed to fetch", and a verdict without the caution. The pour is made for this spec.
 */

const stamp = Date.now().toString(36);
const POUR = `Walk ${stamp}`;
const TAG = `WK-${stamp}`;
const TABLET = { width: 1280, height: 800 };
const PORTRAIT = { width: 800, height: 1280 };
const DESKTOP = { width: 1440, height: 900 };
const UUID = /[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/i;
const DEMO_ADDRESS = /[a-z]+@(demo|other)\.tautline\.test/i;

// A 1×1 PNG standing in for the tablet camera's gauge photo.
const GAUGE_PHOTO = Buffer.from(
  "iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==",
  "base64",
);

/** The same word twice in a row ("Set Set W"), and the same four words twice on one line (each side of a change alone). */
function doubledWords(text: string): string[] {
  const found: string[] = [];
  const re = /\b([A-Za-z][A-Za-z'-]*)[ \t]+\1\b/g;
  for (let m = re.exec(text); m; m = re.exec(text)) found.push(m[0]);
  // A change written as `"before" → "after"` gives the text twice by design: each side is read alone.
  for (const line of text.split("\n").flatMap((l) => l.split(" → "))) {
    // Words only: the letters of a tag ("2-2-U01") are not words.
    const words = line.toLowerCase().match(/(?<![\w-])[a-z][a-z']+(?![\w-])/g) ?? [];
    const seen = new Set<string>();
    for (let i = 0; i + 4 <= words.length; i++) {
      const phrase = words.slice(i, i + 4).join(" ");
      if (seen.has(phrase)) found.push(`${phrase} (twice in "${line.slice(0, 80)}…")`);
      seen.add(phrase);
    }
  }
  return found;
}

/** A count of one written in the plural ("1 tendons"). */
const ONE_IN_PLURAL =
  /(?<!of )\b1 (tendons|pours|records|stressing records|flags|equipment sets|calibrations|strand lots)\b/;

/**
 * Photographs the screen and reads it as a person would. `addresses` allows e-mail addresses on
 * screens whose job is to show them (the people list); nowhere else is a person named by address.
 */
async function look(page: Page, name: string, { addresses = false } = {}): Promise<string> {
  await page.evaluate(() => window.scrollTo(0, 0));
  await screenshot(page, `walk-${name}`);
  const text = await page.locator("body").innerText();
  expect.soft(text, `${name}: a raw id on screen`).not.toMatch(UUID);
  expect.soft(text, `${name}: the browser's own error words`).not.toContain("Failed to fetch");
  expect.soft(doubledWords(text), `${name}: a word written twice`).toEqual([]);
  expect.soft(text, `${name}: one thing counted in the plural`).not.toMatch(ONE_IN_PLURAL);
  expect.soft(text, `${name}: a hyphen for the minus sign`).not.toMatch(/(?<![\w-])-\d+(\.\d+)? ?%/);
  if (!addresses) expect.soft(text, `${name}: a person named by e-mail address`).not.toMatch(DEMO_ADDRESS);
  // Wherever a verdict is shown, the caution is on the same page.
  if ((await page.locator("[data-verdict]").count()) > 0)
    await expect
      .soft(page.getByRole("note", { name: "Caution" }).first(), `${name}: a verdict without the caution`)
      .toBeVisible();
  return text;
}

/**
 * On a desktop the pour schedule shows its key columns, the tag and the latest verdict, inside the
 * table's own box without scrolling it sideways, and the verdict chip stands on one line.
 */
async function expectKeyColumnsInSight(page: Page) {
  const region = page.getByRole("region", { name: "Tendon schedule, scrolls sideways" });
  const box = (await region.boundingBox())!;
  for (const name of ["Tag", "Latest verdict"]) {
    const header = (await region.getByRole("columnheader", { name }).boundingBox())!;
    expect(header.x + header.width, `the ${name} column inside the schedule's box`).toBeLessThanOrEqual(
      box.x + box.width,
    );
  }
  const chip = region.locator("[data-verdict]").first();
  const lines = await chip.evaluate((el) => {
    const height = el.getBoundingClientRect().height;
    const line = parseFloat(getComputedStyle(el).lineHeight);
    return { height, line, wraps: getComputedStyle(el).whiteSpace };
  });
  expect(lines.wraps, "the verdict chip does not wrap").toBe("nowrap");
  expect(lines.height, "the verdict chip on one line").toBeLessThan(2 * lines.line);
}

/** On a desktop the photo link is in sight, not cut off past the side of the records table. */
async function expectInsideRecordsTable(page: Page, link: Locator) {
  const table = await page.getByRole("region", { name: /^Stressing records, scrolls/ }).boundingBox();
  const box = await link.boundingBox();
  expect(box!.x + box!.width, "the photo link lies inside the records table's box").toBeLessThanOrEqual(
    table!.x + table!.width,
  );
}

async function signedIn(browser: Browser, email: string, viewport: { width: number; height: number }) {
  const ctx = await browser.newContext({ viewport, hasTouch: viewport.width < 1400 });
  const page = await ctx.newPage();
  await signInWithPassword(page, email);
  await page.waitForURL(/\/home$/);
  await expect(page.getByRole("heading", { name: "Today", level: 1 })).toBeVisible();
  return { ctx, page };
}

test("one pour from the slab edge to the signed report, as each person sees it", async ({ browser }) => {
  test.setTimeout(300_000);
  const fx = await makePourFixture(POUR, [TAG]);
  const tendonId = fx.tendons[0]!.id;
  const long = typedReading(fx, 1.15);
  const inBand = typedReading(fx, 1.0);
  const [people] = await queryDemo<{ crew: string; engineer: string; inspector: string }>(
    `select (select name from users where email = $1) as crew, (select name from users where email = $2) as engineer,
            (select name from users where email = $3) as inspector`,
    [PEOPLE.crew, PEOPLE.engineer, PEOPLE.inspector],
  );

  // ── The crew, tablet in landscape: takes the pour out, loses the signal, logs the end with a photo.
  const crew = await signedIn(browser, PEOPLE.crew, TABLET);
  const tablet = crew.page;
  await expect(tablet.getByRole("heading", { level: 1 })).toBeVisible();
  await look(tablet, "crew-home");
  await tablet.goto("/field");
  await tablet.evaluate(() => navigator.serviceWorker.ready);
  await tablet.waitForFunction(() => navigator.serviceWorker.controller !== null);
  await expect(tablet.getByTestId("operator")).toContainText(people!.crew);
  await tablet.getByTestId("available-pour").filter({ hasText: POUR }).getByRole("button").click();
  const ready = tablet.getByTestId("ready-pour").filter({ hasText: POUR });
  await expect(ready.getByTestId("ready-offline")).toBeVisible();
  await look(tablet, "crew-field-ready");

  await crew.ctx.setOffline(true);
  await ready.getByRole("link", { name: "Open tendon list" }).click();
  await expect(tablet.getByTestId("connection")).toHaveText("No signal");
  await tablet.getByTestId("tendon-row").filter({ hasText: TAG }).click();
  await expect(tablet.getByTestId("selected-tag")).toHaveText(TAG);
  await tablet.getByRole("radio", { name: /Set A/ }).check();
  await tablet.getByLabel(/Final gauge pressure/).fill(long.psi);
  await tablet.getByLabel(/Mark before/).fill(long.before);
  await tablet.getByLabel(/Mark after/).fill(long.after);
  const more = tablet.getByRole("button", { name: "Breaks, remarks, photos" });
  if (await more.isVisible()) await more.click();
  await tablet
    .locator('input[type="file"]')
    .setInputFiles({ name: "gauge.png", mimeType: "image/png", buffer: GAUGE_PHOTO });
  await expect(tablet.getByRole("img", { name: "Photo to keep with this record" })).toHaveCount(1);
  await look(tablet, "crew-form-offline-landscape");
  await tablet.getByRole("button", { name: "Save record" }).click();
  await expect(tablet.getByTestId("verdict").locator("[data-verdict]").first()).toContainText("Long");
  await expect(tablet.getByTestId("end-A").getByTestId("sync-state")).toHaveText("waiting to send");
  await expect(tablet.getByTestId("pending-count")).toContainText("1 record");
  await look(tablet, "crew-saved-offline-landscape");
  await tablet.setViewportSize(PORTRAIT);
  await look(tablet, "crew-saved-offline-portrait");
  await tablet.setViewportSize(TABLET);

  // The signal comes back, but the photo's upload does not get through yet: the record goes, the
  // photo waits, and the crew is told so in words.
  const uploads = "**/api/projects/*/uploads";
  await tablet.route(uploads, (route) => route.abort("internetdisconnected"));
  const beforeMail = await lastMailId();
  await crew.ctx.setOffline(false);
  await tablet.getByRole("button", { name: "Sync now" }).click();
  await expect(tablet.getByTestId("pending-count")).toContainText("0 records", { timeout: 20_000 });
  await expect(tablet.getByTestId("server-verdict")).toContainText("Long");
  await expect(tablet.getByTestId("judged-by")).toHaveText(/judged by the server/i);
  await expect(tablet.getByTestId("photos-waiting")).toContainText("1");
  await look(tablet, "crew-synced-photo-waiting");

  // ── The engineer of record, at a desk: the flag e-mail, and the page it opens.
  const mail = await latestMailTo(PEOPLE.engineer, beforeMail, 60_000, (m) => m.subject.includes(TAG));
  const [flag] = await queryDemo<{ id: string; number: string }>(
    `select id, (select count(*) from flags f2 where f2.project_id = flags.project_id
       and (f2.created_at, f2.id) <= (flags.created_at, flags.id)) as number
     from flags where tendon_id = $1 and kind = 'out_of_band'`,
    [tendonId],
  );
  const flagRef = `F-${String(flag!.number).padStart(4, "0")}`;
  expect(mail.text).toContain(`tendon ${TAG}`);
  // The e-mail names the flag as every screen does.
  expect(mail.text).toContain(`Flag ${flagRef} (Out of band):`);
  expect(mail.text).toContain("Caution");
  const textOutsideLinks = mail.text.replace(/https?:\/\/\S+/g, "");
  expect.soft(textOutsideLinks).not.toMatch(UUID);
  expect.soft(doubledWords(textOutsideLinks)).toEqual([]);
  const link = /https?:\/\/\S+\/flags\?flag=[0-9a-f-]{36}/.exec(mail.text)![0];
  const flagPath = `${new URL(link).pathname}${new URL(link).search}`;

  const engineer = await signedIn(browser, PEOPLE.engineer, DESKTOP);
  const desk = engineer.page;
  await look(desk, "engineer-home");
  await desk.goto(flagPath);
  await expect(desk.getByRole("heading", { name: `Tendon ${TAG}`, level: 1 })).toBeVisible();
  const decision = desk.getByTestId("decision-column");
  await expect(decision).toContainText(flagRef);
  // The photo is still on the tablet: the page says so instead of a link that answers 404.
  await expect(desk.getByRole("link", { name: /^Photo/ })).toHaveCount(0);
  await look(desk, "engineer-flag-photo-waiting");

  // The photo goes up on the crew's next sync; now it is linked, and the link serves it.
  await tablet.unroute(uploads);
  await tablet.getByRole("button", { name: "Sync now" }).click();
  await expect(tablet.getByTestId("photos-waiting")).toHaveCount(0, { timeout: 20_000 });
  await desk.reload();
  const photoLink = desk.getByRole("link", { name: /^Photo 1/ });
  await expect(photoLink).toHaveCount(1);
  await expectInsideRecordsTable(desk, photoLink);
  const photo = await desk.request.get((await photoLink.getAttribute("href"))!);
  expect(photo.status()).toBe(200);
  // The tablet keeps the camera's picture as a JPEG before it goes.
  expect(photo.headers()["content-type"]).toMatch(/^image\//);
  expect((await photo.body()).byteLength).toBeGreaterThan(0);
  // The record says who logged it by name.
  await expect(desk.locator("main:not([aria-busy])")).toContainText(people!.crew);
  const flagPage = await look(desk, "engineer-flag");
  // A US project: the calculation sheet gives the strand in in² and ksi, never in SI units.
  expect(flagPage).not.toMatch(/\bGPa\b|mm²|\bMPa\b/);

  // The decision: a restress.
  await desk.getByLabel("Restress", { exact: true }).check();
  await desk
    .getByLabel("Reasons")
    .fill("Long by about 15 %: check the wedges seated, restress to the same gauge pressure and re-read the marks.");
  await desk.getByLabel(/Licence statement/).fill("Licensed professional engineer (demo licence, invented)");
  await desk.getByRole("button", { name: "Record the disposition" }).click();
  await expect(desk.getByText(/D-\d{4} · Disposition: Restress/)).toBeVisible();
  await look(desk, "engineer-flag-decided");
  await desk.goto("/decisions");
  await expect(desk.locator(`[data-pour="${POUR}"]`)).toContainText("Cannot be released yet.");
  await look(desk, "engineer-decisions");

  // ── The inspector, at a desk: the same page and the same photo.
  const inspector = await signedIn(browser, PEOPLE.inspector, DESKTOP);
  const office = inspector.page;
  await look(office, "inspector-home");
  await office.goto("/review");
  await look(office, "inspector-review");
  await office.goto(flagPath);
  await expect(office.getByRole("heading", { name: `Tendon ${TAG}`, level: 1 })).toBeVisible();
  const inspectorPhoto = office.getByRole("link", { name: /^Photo 1/ });
  await expectInsideRecordsTable(office, inspectorPhoto);
  expect((await office.request.get((await inspectorPhoto.getAttribute("href"))!)).status()).toBe(200);
  await look(office, "inspector-flag");

  // ── The crew again: the order comes down with the next sync, in words, on both orientations.
  await tablet.getByRole("button", { name: "Sync now" }).click();
  const row = tablet.getByTestId("tendon-row").filter({ hasText: TAG });
  await expect(row.getByTestId("hold-summary")).toHaveText("Held · restress ordered", { timeout: 15_000 });
  const hold = tablet.getByTestId("hold-panel");
  await expect(hold.getByTestId("hold-instruction")).toContainText("restress to the same gauge pressure");
  await expect(hold).toContainText(people!.engineer);
  await expect(tablet.getByTestId("tail-cut")).toHaveAttribute("data-cut", "held");
  // The verdict box follows the disposition: it says what was ordered, not that one is awaited.
  const outOfBand = tablet.getByTestId("out-of-band-hold");
  await expect(outOfBand).toContainText("The engineer of record's disposition: restress ordered.");
  await expect(outOfBand).not.toContainText("gives a disposition");
  await look(tablet, "crew-order-landscape");
  await tablet.setViewportSize(PORTRAIT);
  await look(tablet, "crew-order-portrait");
  // What the crew sees without scrolling, as the full-page shot stretches the page.
  await tablet.screenshot({ path: "test-results/screens/walk-crew-order-portrait-screen.png" });
  // In portrait with no form open the tendon's cards stand in one column, at their own heights: the
  // restress button keeps its glove size and is not stretched to the height of a card beside it.
  const status = tablet.getByTestId("tendon-status");
  expect(
    await status.evaluate((el) => getComputedStyle(el).gridTemplateColumns.split(" ").length),
    "one column of tendon cards in portrait",
  ).toBe(1);
  const restress = await tablet.getByRole("button", { name: "Record a restress" }).boundingBox();
  expect(restress!.height, "the restress button at glove size, not stretched").toBeGreaterThanOrEqual(48);
  expect(restress!.height, "the restress button at glove size, not stretched").toBeLessThan(100);

  await tablet.getByRole("button", { name: "Record a restress" }).click();
  const form = tablet.getByRole("form", { name: "New record" });
  await form
    .locator("label")
    .filter({ hasText: /^End A/ })
    .click();
  await tablet.getByRole("radio", { name: /Set A/ }).check();
  await tablet.getByLabel(/Final gauge pressure/).fill(inBand.psi);
  await tablet.getByLabel(/Mark before/).fill(inBand.before);
  await tablet.getByLabel(/Mark after/).fill(inBand.after);
  await look(tablet, "crew-restress-form-portrait");
  await tablet.getByRole("button", { name: "Save record" }).click();
  await tablet.getByRole("button", { name: "Sync now" }).click();
  await expect(hold).toHaveCount(0, { timeout: 15_000 });
  await expect(tablet.getByTestId("server-verdict")).toContainText("In band");
  const tails = tablet.getByTestId("tail-cut");
  await expect(tails).toHaveAttribute("data-cut", "clear");
  await look(tablet, "crew-clear-portrait");
  await tablet.setViewportSize(TABLET);
  await tails.getByTestId("tail-cut-button").click();
  const confirm = tablet.getByRole("dialog", { name: `Record tails cut on ${TAG}?` });
  await look(tablet, "crew-cut-confirm");
  await confirm.getByRole("button", { name: `Tails of ${TAG} are cut` }).click();
  await expect(tails).toHaveAttribute("data-cut", "cut");
  await tablet.getByRole("button", { name: "Sync now" }).click();
  await expect(tails.getByTestId("tail-cut-sync")).toHaveText("received by the server", { timeout: 15_000 });
  await expect(row.getByTestId("tail-state")).toHaveText("Tails cut");
  await look(tablet, "crew-tails-cut");

  // The flag closed with the restress, and its closing names the disposition by its reference.
  await office.goto(flagPath);
  await expect(office.getByTestId("decision-column")).toContainText(flagRef);
  await expect(office.locator("main:not([aria-busy])")).toContainText(/Restressed as ordered by disposition D-\d{4}/);
  await look(office, "inspector-flag-closed");

  // ── The inspector signs the pour's report; the PDF downloads.
  await office.goto(`/projects/${fx.projectId}/pours/${fx.pourId}/insight`);
  await expect(office.getByTestId("signature-state")).toHaveText("The report is not signed yet.");
  await look(office, "inspector-insight");
  const sign = office.getByRole("form", { name: new RegExp(`Sign the stressing report of ${POUR}`) });
  await expect(sign.getByLabel(/name/i).first()).toHaveValue(people!.inspector);
  await sign.getByLabel("Licence or certification number").fill("ICC special inspector 5551234 (demo)");
  await sign.getByRole("button", { name: "Sign revision 1" }).click();
  await office
    .getByRole("dialog", { name: /^Sign revision 1 of the stressing report/ })
    .getByRole("button", { name: "Sign", exact: true })
    .click();
  await expect(office.getByTestId("signature-state")).toHaveText("The report as it stands is signed: revision 1.", {
    timeout: 30_000,
  });
  await look(office, "inspector-signed");
  const download = office.waitForEvent("download");
  await office.getByRole("link", { name: "Signed PDF, revision 1" }).click();
  const pdf = await (await download).path();
  const { readFile } = await import("node:fs/promises");
  const bytes = await readFile(pdf);
  expect(bytes.subarray(0, 5).toString()).toBe("%PDF-");
  // The report reads like the screens: the tendon, the flag and disposition by reference, the
  // people by name, the caution, and no raw id.
  const parser = new PDFParse({ data: new Uint8Array(bytes) });
  const report = (await parser.getText().finally(() => parser.destroy())).text;
  expect(report).toContain(TAG);
  expect(report).toContain(flagRef);
  expect(report).toMatch(/D-\d{4}/);
  expect(report).toContain(people!.crew);
  expect(report).toMatch(/Caution/);
  expect.soft(report, "report: a raw id").not.toMatch(UUID);
  expect.soft(report, "report: an address for a name").not.toMatch(DEMO_ADDRESS);
  expect.soft(report, "report: one thing counted in the plural").not.toMatch(ONE_IN_PLURAL);

  // The inspector's day, and the engineer's e-mail choice.
  await office.goto(`/projects/${fx.projectId}/daily`);
  await expect(office.getByRole("heading", { level: 1 })).toBeVisible();
  await look(office, "inspector-daily");
  // The pour is clear now: the engineer's Today says in plain words who releases it.
  await desk.goto("/home");
  await expect(desk.locator(`[data-pour="${POUR}"]`)).toContainText(
    "Ready for release: the engineer of record releases it.",
  );
  await look(desk, "engineer-home-ready");
  await desk.goto(`/projects/${fx.projectId}/flag-mail`);
  await expect(desk.getByRole("heading", { level: 1 })).toBeVisible();
  // Both choices have a radio of the same size: the long label does not squeeze its box.
  const [each, digest] = await Promise.all(
    [/One e-mail per flag/, /One digest per shift/].map((name) => desk.getByRole("radio", { name }).boundingBox()),
  );
  expect(digest!.width).toBe(each!.width);
  await look(desk, "engineer-flag-mail");

  // ── The admin, at a desk: home, setup, the pour's schedule and tendon, the people, the share links.
  const admin = await signedIn(browser, PEOPLE.admin, DESKTOP);
  const a = admin.page;
  await look(a, "admin-home");
  for (const [path, name, opts] of [
    ["/setup", "admin-setup-all", {}],
    [`/projects/${fx.projectId}/setup`, "admin-setup", {}],
    [`/projects/${fx.projectId}/pours`, "admin-pours", {}],
    [`/projects/${fx.projectId}/pours/${fx.pourId}`, "admin-schedule", {}],
    [`/projects/${fx.projectId}/tendons/${tendonId}`, "admin-tendon", {}],
    [`/projects/${fx.projectId}/equipment`, "admin-equipment", {}],
    [`/projects/${fx.projectId}/strand-lots`, "admin-strand-lots", {}],
    [`/projects/${fx.projectId}/members`, "admin-members", { addresses: true }],
    [`/projects/${fx.projectId}/share`, "admin-share", {}],
  ] as const) {
    await a.goto(path);
    await expect(a.getByRole("heading", { level: 1 })).toBeVisible();
    await look(a, name, opts);
    if (name === "admin-schedule") await expectKeyColumnsInSight(a);
  }
  await a.goto(`/projects/${fx.projectId}/tendons/${tendonId}`);
  await expect(a.locator("main:not([aria-busy])")).toContainText(TAG);

  for (const s of [crew, engineer, inspector, admin]) await s.ctx.close();
});
