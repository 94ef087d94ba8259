import { expect, type Browser, type Page } from "@playwright/test";
import type { AvailablePour, PullResponse } from "@/lib/schemas/sync";
import { predictTendon, targetPressureMPa } from "@/lib/stressing/basis";
import { formatLength, mpaToPsi } from "@/lib/units";
import { PEOPLE, apiAs, signInWithPassword } from "./people";
import { makePourFixture } from "./pour-fixture";
import { screenshot } from "./support";

/** The field log's e2e steps, shared by the specs that drive the tablet. */

/** What the crew says to stress a pour whose concrete strength the lab has not confirmed. */
export const CONCRETE_GO_AHEAD = "Inspector read the field-cured cylinders on site at 3,200 psi this morning.";

/**
 * A pour of the test's own, planned like the demo's L3 Pour 1: `count` one-end tendons copied from
 * the demo schedule and no concrete results yet, so the tablet asks why stressing goes ahead.
 * Each test stresses only its own pour, so it passes alone and in any order.
 */
export async function makeFieldPour(label: string, count: number): Promise<{ name: string; count: number }> {
  const stamp = `${Date.now().toString(36)}${Math.floor(Math.random() * 1296).toString(36)}`;
  const name = `${label} ${stamp}`;
  const tags = Array.from({ length: count }, (_, i) => `FL-${stamp}-${String(i + 1).padStart(2, "0")}`);
  await makePourFixture(name, tags, { concreteConfirmed: false });
  return { name, count };
}

export interface Plan {
  pourId: string;
  pourName: string;
  tendons: { id: string; tag: string; after: string; verdict: "In band" | "Long" }[];
  finalPsi: string;
}

/** Three one-end tendons of the pour with nothing recorded yet, with readings worked out on the same basis as the app. */
export async function plan(pourName: string): Promise<Plan> {
  const crew = await apiAs(PEOPLE.crew);
  const { pours } = (await (await crew.get("/api/field/pours")).json()) as { pours: AvailablePour[] };
  const pour = pours.find((p) => p.name === pourName && p.projectCode === "AYP")!;
  expect(pour, `the crew's download list offers ${pourName}`).toBeTruthy();
  const data = (await (await crew.get(`/api/field/pours/${pour.id}`)).json()) as PullResponse;
  await crew.dispose();
  const project = data.projects[0]!;
  const setA = data.equipmentSets.find((s) => s.name.startsWith("Set A"))!;
  const cal = data.calibrations.find((c) => c.equipmentSetId === setA.id)!;
  const stressed = new Set(data.records.map((r) => r.tendonId));
  const free = data.tendons.filter((t) => t.ends === "A" && !stressed.has(t.id)).slice(0, 3);
  expect(free).toHaveLength(3);
  let jackingForceN = 0;
  const tendons = free.map((t, i) => {
    const lot = data.strandLots.find((l) => l.id === t.strandLotId) ?? null;
    const p = predictTendon({ project, tendon: t, lot, equipmentGripMm: setA.jackGripMm });
    jackingForceN = p.jackingForceN;
    // The second tendon reads a quarter long: out of any band.
    const out = i === 1;
    return {
      id: t.id,
      tag: t.tag,
      after: formatLength(p.predictedMm * (out ? 1.25 : 1), "1/8 in"),
      verdict: out ? ("Long" as const) : ("In band" as const),
    };
  });
  const line = {
    slope: cal.slope,
    intercept: cal.intercept,
    minPressureMPa: cal.minPressureMPa,
    maxPressureMPa: cal.maxPressureMPa,
  };
  return {
    pourId: pour.id,
    pourName,
    tendons,
    finalPsi: String(Math.round(mpaToPsi(targetPressureMPa(line, jackingForceN)))),
  };
}

/** Signs the crew in and opens the pour's tendon list on the field log, taking the pour out first. */
export async function openPourAsCrew(page: Page, pourName: string): Promise<void> {
  await signInWithPassword(page, PEOPLE.crew);
  await page.waitForURL(/\/home/);
  await page.goto("/field");
  await page.getByTestId("available-pour").filter({ hasText: pourName }).getByRole("button").click();
  await page
    .getByTestId("ready-pour")
    .filter({ hasText: pourName })
    .getByRole("link", { name: "Open tendon list" })
    .click();
}

/**
 * On a portrait tablet (800 × 1280), the crew opens the pour, whose first tendon is held as
 * `summary` says; opens that tendon, whose hold panel says `whatToDo`; then the signal goes.
 */
export async function heldTendonOffline(browser: Browser, pourName: string, summary: string, whatToDo: string) {
  const ctx = await browser.newContext({ viewport: { width: 800, height: 1280 }, hasTouch: true });
  const crew = await ctx.newPage();
  await openPourAsCrew(crew, pourName);
  const rows = crew.getByTestId("tendon-row");
  await expect(rows.first().getByTestId("hold-summary")).toHaveText(summary);
  await rows.first().click();
  const panel = crew.getByTestId("hold-panel");
  await expect(panel.getByTestId("hold-what-to-do")).toContainText(whatToDo);
  await ctx.setOffline(true);
  await expect(crew.getByTestId("connection")).toHaveText("No signal");
  return { ctx, crew, rows, panel };
}

/**
 * The engineer, signed in on a browser of their own (portrait by default; `null`: the browser's
 * own size), on a tendon's flags page.
 */
export async function tendonFlagsAsEngineer(
  browser: Browser,
  projectId: string,
  tendonId: string,
  viewport: { width: number; height: number } | null = { width: 800, height: 1280 },
) {
  const office = await browser.newContext(viewport ? { viewport } : {});
  const engineer = await office.newPage();
  await signInWithPassword(engineer, PEOPLE.engineer);
  await engineer.waitForURL(/\/home/);
  await engineer.goto(`/projects/${projectId}/tendons/${tendonId}/flags`);
  return { office, engineer };
}

/** Full-page shots from the top, so the sticky status bar sits where the crew sees it. */
export async function shoot(page: Page, name: string) {
  await page.evaluate(() => window.scrollTo(0, 0));
  await screenshot(page, name);
}

// A 1×1 PNG standing in for the tablet camera's gauge photo.
const GAUGE_PHOTO = Buffer.from(
  "iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==",
  "base64",
);

export async function logTendon(
  page: Page,
  t: Plan["tendons"][number],
  finalPsi: string,
  shot?: string,
  photo = false,
) {
  await page.getByLabel("Find a tendon by tag").fill(t.tag);
  await page.getByTestId("tendon-row").filter({ hasText: t.tag }).click();
  await expect(page.getByTestId("selected-tag")).toHaveText(t.tag);
  await page.getByRole("radio", { name: /Set A/ }).check();
  await page.getByLabel(/Final gauge pressure/).fill(finalPsi);
  await page.getByLabel(/Mark before/).fill("0");
  await page.getByLabel(/Mark after/).fill(t.after);
  if (photo) {
    await page
      .locator('input[type="file"]')
      .setInputFiles({ name: "gauge.png", mimeType: "image/png", buffer: GAUGE_PHOTO });
    await expect(page.getByRole("img", { name: "Photo to keep with this record" })).toHaveCount(1);
  }
  // The pour has no confirmed concrete strength: the form asks why stressing goes ahead.
  await expect(page.getByTestId("concrete-go-ahead")).toContainText("Concrete not confirmed");
  await page.getByLabel(/Who confirmed the concrete on site/).fill(CONCRETE_GO_AHEAD);
  if (shot) await shoot(page, shot);
  await page.getByRole("button", { name: "Save record" }).click();
  await expect(page.getByTestId("verdict").locator("[data-verdict]").first()).toContainText(t.verdict);
  await expect(page.getByTestId("end-A").getByTestId("sync-state")).toHaveText("waiting to send");
}
