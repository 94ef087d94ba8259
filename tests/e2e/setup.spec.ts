import { expect, test } from "@playwright/test";
import { PEOPLE, queryDemo, signInWithPassword } from "./people";
import { screenshot } from "./support";
import { dayInZone } from "@/lib/format/dates";

// Builds a throwaway pour, lot and equipment set of its own on the demo project, so the demo
// data other specs rely on stays as it is.
const stamp = String(Date.now()).slice(-7);
const POUR = `E2E Pour ${stamp}`;
const LOT = `E2E-${stamp}`;
const SET = `E2E set ${stamp}`;
const HEADER =
  "tag,type,strand size [in],strands,ends,segments [ft@deg],jack grip [in],shop elongation [in],strand lot";
const CERTIFICATE = Buffer.from("%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n");

function schedule(rows: number): string {
  const lines = Array.from({ length: rows }, (_, i) => {
    const tag = `E${stamp}-${String(i + 1).padStart(3, "0")}`;
    const spans = i % 5 === 0 ? "15@1.35 15@1.35 15@1.35 15@1.35 15@1.35 15@1.35" : "15@1.35 15@1.35 15@1.35 15@1.35";
    return `${tag},monostrand,0.5,1,${i % 5 === 0 ? "both" : "A"},${spans},18,${i === 0 ? "4.5" : ""},`;
  });
  return [HEADER, ...lines].join("\n");
}

test("an admin sets up a pour, imports its schedule, adds a strand lot and a calibrated equipment set, and sees the target gauge pressure", async ({
  page,
}) => {
  test.setTimeout(120_000);
  await signInWithPassword(page, PEOPLE.admin);
  await expect(page).toHaveURL(/\/home$/);

  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Project setup" }).click();
  await expect(page.getByRole("heading", { name: "Project setup", level: 1 })).toBeVisible();
  await screenshot(page, "setup-projects");
  await page.getByRole("link", { name: "Set up AYP" }).click();

  // Settings: saved as they are, in the project's units.
  await expect(page.getByRole("heading", { name: "Settings", level: 1 })).toBeVisible();
  await expect(page.getByLabel("Band per tendon, ± %")).toHaveValue("7");
  await expect(page.getByLabel("Anchor set, in")).toHaveValue("0.25");
  await page.getByLabel("Band per tendon, ± %").fill("30");
  await page.getByRole("button", { name: "Save settings" }).click();
  await expect(page.getByText("A band above 25 % is not a check.")).toBeVisible();
  // Two bad boxes at once: each is answered beside its box, tied to it, and nothing is saved.
  const band = page.getByLabel("Band per tendon, ± %");
  const skew = page.getByLabel(/tablet time is off the server's/);
  await skew.fill("lots");
  await page.getByRole("button", { name: "Save settings" }).click();
  await expect(page.locator("#s-tolerancePct-error")).toHaveText("A band above 25 % is not a check.");
  await expect(page.locator("#s-clockSkewMinutes-error")).toHaveText("Type a number.");
  for (const [box, id] of [
    [band, "s-tolerancePct"],
    [skew, "s-clockSkewMinutes"],
  ] as const) {
    await expect(box).toHaveAttribute("aria-invalid", "true");
    await expect(box).toHaveAttribute("aria-describedby", new RegExp(`\\b${id}-error\\b`));
  }
  await expect(band).toHaveAccessibleDescription(/A band above 25 % is not a check\./);
  await expect(skew).toHaveAccessibleDescription(/Type a number\./);
  await screenshot(page, "setup-settings-two-errors");
  await skew.fill("10");
  await page.getByLabel("Band per tendon, ± %").fill("7");
  // A length in the settings is read as the field log reads it: a fraction of an inch.
  await page.getByLabel("Anchor set, in").fill("1/4");
  await page.getByRole("button", { name: "Save settings" }).click();
  await expect(page.getByText("Settings saved.")).toBeVisible();
  await expect(band).not.toHaveAttribute("aria-invalid", "true");
  await screenshot(page, "setup-settings");
  // A narrower band would change stressed tendons' verdicts: the admin is told how many before saving.
  await page.getByLabel("Band per tendon, ± %").fill("1");
  await page.getByRole("button", { name: "Save settings" }).click();
  await expect(page.getByText(/verdicts? change/)).toBeVisible();
  await expect(page.getByText("Press Save settings again to confirm.")).toBeVisible();
  await screenshot(page, "setup-settings-preview");
  await page.getByLabel("Band per tendon, ± %").fill("7");
  await page.getByRole("button", { name: "Save settings" }).click();
  await expect(page.getByText("Settings saved.")).toBeVisible();

  // A pour, then its schedule: a bad file first (nothing imported), then the good one.
  await page
    .getByRole("navigation", { name: "Project setup" })
    .getByRole("link", { name: "Pours and tendons" })
    .click();
  await page.getByLabel("Name, as drawn").fill(POUR);
  await page.getByLabel("Level").fill("Level 5");
  await page.getByLabel("Planned stressing").fill("2027-02-01");
  await page.getByRole("button", { name: "Add pour" }).click();
  await expect(page.getByText(`Pour ${POUR} added.`)).toBeVisible();
  await page.getByRole("link", { name: POUR }).click();
  await expect(page.getByRole("heading", { name: POUR, level: 1 })).toBeVisible();
  await expect(page.getByText("This pour has no tendons yet.")).toBeVisible();

  const bad = `${HEADER}\nB1,monostrand,0.5,1,A,15@1.35,18,,\nB1,monostrand,0.7,1,A,15@1.35,18,,\n=CMD(),monostrand,0.5,1,A,15@1.35,,,`;
  await page
    .getByLabel("Schedule CSV")
    .setInputFiles({ name: "bad.csv", mimeType: "text/csv", buffer: Buffer.from(bad) });
  const alert = page.getByRole("alert").filter({ hasText: "nothing was imported" });
  await expect(alert).toBeVisible();
  await expect(alert).toContainText("line 3 · tag");
  await expect(alert).toContainText("line 3 · strand size");
  await expect(alert).toContainText("line 4 · tag");
  await screenshot(page, "setup-import-errors");

  await page
    .getByLabel("Schedule CSV")
    .setInputFiles({ name: "pour5.csv", mimeType: "text/csv", buffer: Buffer.from(schedule(220)) });
  await expect(page.getByText("220 tendons imported from pour5.csv.")).toBeVisible();
  await expect(page.getByRole("heading", { name: "Tendons (220)" })).toBeVisible();
  // Filter and sort live in the URL.
  await page.getByLabel("Show stressing end").selectOption("both");
  await page.getByRole("button", { name: "Filter" }).click();
  await expect(page).toHaveURL(/ends=both/);
  await expect(page.getByRole("heading", { name: "Tendons (44 of 220)" })).toBeVisible();
  await page.getByRole("link", { name: /^Tag/ }).click();
  await expect(page).toHaveURL(/dir=desc/);
  await expect(page.locator("tbody tr").first()).toContainText(`E${stamp}-216`);
  await screenshot(page, "setup-pour-schedule");

  // A strand lot with its mill certificate.
  await page.getByRole("navigation", { name: "Project setup" }).getByRole("link", { name: "Strand lots" }).click();
  await page.getByLabel("Lot or heat number").fill(LOT);
  await page.getByLabel("Area, in²").fill("0.1545");
  await page.getByLabel("Modulus, ksi").fill("28700");
  await page.getByLabel("Breaking load, kip").fill("42.1");
  await page
    .getByLabel("Mill certificate file")
    .setInputFiles({ name: `${LOT}.pdf`, mimeType: "application/pdf", buffer: CERTIFICATE });
  await expect(page.getByText(`Uploaded and checked: ${LOT}.pdf.`)).toBeVisible();
  await page.getByRole("button", { name: "Register lot" }).click();
  await expect(page.getByText(`Lot ${LOT} registered.`)).toBeVisible();
  const lotRow = page.locator("tr", { hasText: LOT });
  await expect(lotRow.getByRole("link", { name: `${LOT}.pdf` })).toBeVisible();
  await screenshot(page, "setup-strand-lots");
  const download = await page.request.get(
    (await lotRow.getByRole("link", { name: `${LOT}.pdf` }).getAttribute("href"))!,
  );
  expect(download.status()).toBe(200);
  expect(download.headers()["content-disposition"]).toContain("attachment");
  expect((await download.body()).equals(CERTIFICATE)).toBe(true);

  // An equipment set with a calibration.
  await page.getByRole("navigation", { name: "Project setup" }).getByRole("link", { name: "Equipment sets" }).click();
  await page.getByLabel("Set name").fill(SET);
  await page.getByLabel("Jack serial").fill("EJ-77");
  await page.getByLabel("Gauge serial").fill("EG-77");
  // The wedges' draw-in at each re-grip, as a crew types it (1/4 in, our test value).
  await page.getByLabel(/Draw-in per re-grip/).fill("1/4");
  await page.getByRole("button", { name: "Add set" }).click();
  await expect(page.getByText(`${SET} added. Add its calibration next.`)).toBeVisible();
  // The add form, not the correction forms folded on each stored calibration's card.
  const addCalibration = page.locator("form", { has: page.getByRole("heading", { name: "Add a calibration" }) });
  await addCalibration.getByLabel("Equipment set").selectOption({ label: SET });
  // Today at the site: a calibration dated after the site's day would not be in force yet.
  const [site] = await queryDemo<{ time_zone: string }>("select time_zone from projects where code = 'AYP'");
  const today = dayInZone(Date.now(), site!.time_zone);
  await addCalibration.getByLabel("Calibrated on").fill(today);
  // 1000 psi steps at 5.9 kip per 1000 psi, less 0.2 kip: an invented line for the test.
  await addCalibration
    .getByLabel(/Calibration points/)
    .fill([1, 2, 3, 4, 5, 6].map((k) => `${k * 1000}, ${(5.9 * k - 0.2).toFixed(2)}`).join("\n"));
  await addCalibration
    .getByLabel("Calibration certificate file")
    .setInputFiles({ name: "cal.pdf", mimeType: "application/pdf", buffer: CERTIFICATE });
  await expect(page.getByText("Uploaded and checked: cal.pdf.")).toBeVisible();
  await addCalibration.getByRole("button", { name: "Save calibration" }).click();
  await expect(page.getByText(/Calibration saved: r² = 1\.00000/)).toBeVisible();
  const setCard = page.locator("li", { has: page.getByRole("heading", { name: SET }) });
  await expect(setCard).toContainText(`Calibrated: calibrated ${today}`);
  await expect(setCard.getByTestId("set-draw-in")).toHaveText(
    "Draw-in per re-grip: 0.25 in, used for ram travel typed without its own",
  );
  await expect(page.locator("li", { hasText: "Set B · Jack J-31" }).first()).toBeVisible();
  await screenshot(page, "setup-equipment");

  // The tendon: prediction, profile and the target pressure on the new set.
  await page.goto(`${new URL(page.url()).pathname.replace(/equipment$/, "pours")}`);
  await page.getByRole("link", { name: POUR }).click();
  // The schedule shows one set's target gauge when asked, under a header naming the set.
  const scheduleTable = page.getByRole("region", { name: "Tendon schedule, scrolls sideways" });
  await expect(scheduleTable.getByRole("columnheader", { name: "Target gauge" })).toBeVisible();
  await page.getByLabel("Show gauge targets for").selectOption({ label: SET });
  await page.getByRole("button", { name: "Filter" }).click();
  await expect(page).toHaveURL(/[?&]set=/);
  await expect(scheduleTable.getByRole("columnheader", { name: `Target gauge, ${SET}` })).toBeVisible();
  const row = scheduleTable.locator("tr", { hasText: `E${stamp}-001` });
  await expect(row).toContainText("5634 psi");
  await expect(row).not.toContainText("Set B · Jack J-31");
  await screenshot(page, "setup-schedule-one-set");
  await page.getByRole("link", { name: `E${stamp}-001` }).click();
  await expect(page.getByRole("heading", { name: `Tendon E${stamp}-001` })).toBeVisible();
  const target = page.locator("tr", { hasText: SET });
  // Jacking force 0.80 × 41.3 kip = 33.04 kip (ASTM A416 0.5 in strand); (33.04 + 0.2)/5.9 × 1000 psi = 5634 psi.
  await expect(target).toContainText("5634 psi");
  await expect(page.getByText("Check with the detailer")).toBeVisible();
  await expect(page.getByRole("note", { name: "Caution" })).toBeVisible();
  await expect(page.getByRole("img", { name: /Force along the tendon/ })).toBeVisible();
  await screenshot(page, "setup-tendon-detail");
});

test("the crew can read a tendon but not reach the setup screens", async ({ page }) => {
  await signInWithPassword(page, PEOPLE.crew);
  await expect(page).toHaveURL(/\/home$/);
  const me = (await (await page.request.get("/api/me")).json()) as {
    memberships: { projectId: string; projectCode: string }[];
  };
  const projectId = me.memberships.find((m) => m.projectCode === "AYP")!.projectId;
  const res = await page.goto(`/projects/${projectId}/pours`);
  expect(res?.status()).toBe(404);
  const pours = (await (await page.request.get(`/api/projects/${projectId}/pours`)).json()) as {
    pours: { id: string }[];
  };
  const post = await page.request.post(`/api/projects/${projectId}/pours/${pours.pours[0]!.id}/tendons/import`, {
    data: { csv: `${HEADER}\nX,monostrand,0.5,1,A,1@0,,,` },
  });
  expect(post.status()).toBe(403);
});
