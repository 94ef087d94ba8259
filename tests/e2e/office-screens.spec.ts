import { expect, test, type Page } from "@playwright/test";
import { PEOPLE, queryDemo, signInWithPassword } from "./people";
import { screenshot } from "./support";

/**
 * The office screens respect the user's time: the engineer decides without scrolling, acts that
 * cannot be taken back ask once, bad input is answered beside its box, and a missing object is a
 * real 404 that keeps the navigation.
 */

const stamp = Date.now().toString(36);

async function demoProjectId(code = "AYP"): Promise<string> {
  const [row] = await queryDemo<{ id: string }>("select id from projects where code = $1", [code]);
  return row!.id;
}

/** The part of an element inside the window as it is, without scrolling. */
async function insideViewport(page: Page, selector: string) {
  const box = await page.locator(selector).boundingBox();
  const size = page.viewportSize()!;
  expect(box, `${selector} is on the page`).not.toBeNull();
  expect(box!.y, `${selector} starts below the top`).toBeGreaterThanOrEqual(0);
  expect(box!.x).toBeGreaterThanOrEqual(0);
  expect(
    box!.y + box!.height,
    `${selector} ends at ${box!.y + box!.height} px, the window at ${size.height}`,
  ).toBeLessThanOrEqual(size.height);
  expect(box!.x + box!.width).toBeLessThanOrEqual(size.width);
}

test.describe("the engineer's flag page", () => {
  test.use({ viewport: { width: 1440, height: 900 }, hasTouch: false });

  test("opens on the e-mailed flag with the decision form inside the window at 1440×900", async ({ page }) => {
    const projectId = await demoProjectId();
    const flags = await queryDemo<{ id: string; tendon_id: string; kind: string }>(
      `select f.id, f.tendon_id, f.kind from flags f join tendons t on t.id = f.tendon_id
       where f.project_id = $1 and f.status <> 'closed' and t.tag = '2-2-U17' order by f.created_at desc`,
      [projectId],
    );
    expect(flags.length, "the demo has an open flag on 2-2-U17").toBeGreaterThan(0);
    const flag = flags[0]!;

    await signInWithPassword(page, PEOPLE.engineer);
    await page.waitForURL(/\/home$/);
    await page.goto(`/projects/${projectId}/tendons/${flag.tendon_id}/flags?flag=${flag.id}`);
    await expect(page.getByRole("heading", { name: "Tendon 2-2-U17", level: 1 })).toBeVisible();

    // The flag the link named is the one chosen in the form and shown first.
    await expect(page.locator("#disposition-flag")).toHaveValue(flag.id);
    await expect(page.locator("#review-flag")).toHaveValue(flag.id);
    await expect(page.locator(`[data-flag-id="${flag.id}"]`)).toBeVisible();
    await expect(page.getByRole("button", { name: "Record the disposition" })).toBeVisible();
    // The force both ways, as ACI 318 asks: the gauge's and the elongation's, on the sheet's result.
    const result = page.locator('[data-sheet-section="result"]');
    await expect(result).toContainText("Force from the gauge, end A");
    await expect(result).toContainText("Force implied by the elongation, end A");
    expect(await page.evaluate(() => window.scrollY)).toBe(0);
    await insideViewport(page, 'form[aria-label="Record a disposition"]');

    // The sheet sits beside the decision, folded by section; a folded section opens on a click.
    const form = await page.locator('form[aria-label="Record a disposition"]').boundingBox();
    const sheet = await page.getByRole("heading", { name: "Calculation sheet" }).boundingBox();
    expect(sheet!.x + sheet!.width).toBeLessThanOrEqual(form!.x);
    const friction = page.locator('details[data-sheet-section="steps"]');
    await expect(friction).not.toHaveAttribute("open", "");
    await expect(friction.getByRole("columnheader", { name: "Angle change α" })).toBeHidden();
    await friction.getByText("2. Friction, segment by segment").click();
    await expect(friction.getByRole("columnheader", { name: "Angle change α" })).toBeVisible();
    await page.evaluate(() => window.scrollTo(0, 0));
    await page.screenshot({ path: "test-results/screens/flag-decision-1440x900.png" });
    await screenshot(page, "flag-decision-1440-full");
  });

  test("a link naming a flag of another tendon says so and keeps the tendon's own", async ({ page }) => {
    const projectId = await demoProjectId();
    const [tendon] = await queryDemo<{ id: string }>(
      "select t.id from tendons t join flags f on f.tendon_id = t.id where t.project_id = $1 and t.tag = '2-2-U17' limit 1",
      [projectId],
    );
    await signInWithPassword(page, PEOPLE.engineer);
    await page.waitForURL(/\/home$/);
    await page.goto(`/projects/${projectId}/tendons/${tendon!.id}/flags?flag=00000000-0000-4000-8000-000000000000`);
    await expect(
      page.getByRole("status").filter({ hasText: "The flag in the link is not on this tendon" }),
    ).toBeVisible();
  });
});

test("a role change that gives engineer rights, and a removal, ask once and say what will happen", async ({ page }) => {
  const projectId = await demoProjectId();
  const email = `temp-${stamp}@demo.tautline.test`;
  const name = `Robin Test ${stamp}`;
  const [user] = await queryDemo<{ id: string }>("insert into users (email, name) values ($1, $2) returning id", [
    email,
    name,
  ]);
  await queryDemo("insert into project_members (project_id, user_id, role) values ($1, $2, 'crew')", [
    projectId,
    user!.id,
  ]);
  const role = async () =>
    (
      await queryDemo<{ role: string }>("select role from project_members where project_id = $1 and user_id = $2", [
        projectId,
        user!.id,
      ])
    )[0]?.role;

  await signInWithPassword(page, PEOPLE.admin);
  await page.waitForURL(/\/home$/);
  await page.goto(`/projects/${projectId}/members`);
  const select = page.getByLabel(`Role of ${name}`);

  // Crew to inspector gives no engineer or admin rights: it happens at once.
  await select.selectOption("inspector");
  await expect(page.getByText(`${name} is now Special inspector.`)).toBeVisible();
  expect(await role()).toBe("inspector");

  // To engineer of record: a dialog says what changes; Cancel leaves everything as it was.
  await select.selectOption("engineer");
  const dialog = page.getByRole("dialog", { name: `Make ${name} Engineer of record?` });
  await expect(dialog).toBeVisible();
  await expect(dialog).toContainText("record dispositions on flags and release pours");
  await expect(dialog.getByRole("button", { name: "Cancel" })).toBeFocused();
  await screenshot(page, "members-confirm-role");
  await dialog.getByRole("button", { name: "Cancel" }).click();
  await expect(dialog).toBeHidden();
  await expect(select).toHaveValue("inspector");
  expect(await role()).toBe("inspector");

  // Asked once, confirmed once: the change is made.
  await select.selectOption("engineer");
  await dialog.getByRole("button", { name: `Make ${name} Engineer of record` }).click();
  await expect(page.getByText(`${name} is now Engineer of record.`)).toBeVisible();
  expect(await role()).toBe("engineer");

  // Removing a person: Escape cancels, the confirmation removes.
  await page.getByRole("button", { name: `Remove ${name}` }).click();
  const removal = page.getByRole("dialog", { name: `Remove ${name} from the project?` });
  await expect(removal).toContainText("loses access to this project at once");
  await screenshot(page, "members-confirm-removal");
  await page.keyboard.press("Escape");
  await expect(removal).toBeHidden();
  expect(await role()).toBe("engineer");
  await page.getByRole("button", { name: `Remove ${name}` }).click();
  await removal.getByRole("button", { name: `Remove ${name}` }).click();
  await expect(page.getByText(`${name} was removed.`)).toBeVisible();
  expect(await role()).toBeUndefined();
});

test("a bad pour area is answered beside the box and nothing is saved", async ({ page }) => {
  const projectId = await demoProjectId();
  const pour = `Bad area ${stamp}`;
  await signInWithPassword(page, PEOPLE.admin);
  await page.waitForURL(/\/home$/);
  await page.goto(`/projects/${projectId}/pours`);
  await page.getByLabel("Name, as drawn").fill(pour);
  await page.getByLabel("Area, ft²").fill("-500");
  await page.getByLabel("Planned stressing").fill("2026-12-09");
  await page.getByRole("button", { name: "Add pour" }).click();
  const area = page.getByLabel("Area, ft²");
  await expect(area).toHaveAttribute("aria-invalid", "true");
  await expect(page.locator("#p-area-error")).toHaveText("The area must be above 0.");
  await expect(area).toHaveAccessibleDescription("The area must be above 0.");
  await screenshot(page, "pour-form-bad-area");

  // Two faults at once: an empty name and an area that is not a number.
  await page.getByLabel("Name, as drawn").fill("");
  await area.fill("lots");
  await page.getByRole("button", { name: "Add pour" }).click();
  await expect(page.locator("#p-area-error")).toHaveText("Type a number.");
  await expect(page.locator("#p-name-error")).toContainText("Give the pour a name");
  // Each message is read with its own box.
  const name = page.getByLabel("Name, as drawn");
  await expect(name).toHaveAttribute("aria-invalid", "true");
  await expect(name).toHaveAttribute("aria-describedby", "p-name-error");
  await expect(name).toHaveAccessibleDescription(/Give the pour a name/);
  await expect(area).toHaveAttribute("aria-describedby", "p-area-error");
  await expect(area).toHaveAccessibleDescription("Type a number.");
  await screenshot(page, "pour-form-two-errors");
  expect(await queryDemo("select id from pours where name = $1", [pour])).toHaveLength(0);
});

test("a missing or foreign pour, tendon or project answers 404 and keeps the navigation", async ({ page }) => {
  const ayp = await demoProjectId("AYP");
  const qhm = await demoProjectId("QHM");
  const [foreign] = await queryDemo<{ id: string }>(
    "insert into pours (project_id, name, level) values ($1, $2, 'Level 1') returning id",
    [qhm, `Other job ${stamp}`],
  );
  const [own] = await queryDemo<{ id: string }>("select id from pours where project_id = $1 order by name limit 1", [
    ayp,
  ]);
  await signInWithPassword(page, PEOPLE.engineer);
  await page.waitForURL(/\/home$/);

  const missing = "00000000-0000-4000-8000-000000000000";
  for (const [path, what] of [
    [`/projects/${qhm}/pours/${foreign!.id}/insight`, "another project's insight"],
    [`/projects/${ayp}/pours/${foreign!.id}/insight`, "another project's pour under this project"],
    [`/projects/${ayp}/pours/${missing}/insight`, "a pour that does not exist"],
    [`/projects/${ayp}/tendons/${missing}/flags`, "a tendon that does not exist"],
    [`/projects/${ayp}/tendons/not-an-id`, "a malformed tendon id"],
  ] as const) {
    const res = await page.goto(path);
    expect(res?.status(), what).toBe(404);
    await expect(page.getByRole("navigation", { name: "Main" }), what).toBeVisible();
    await expect(page.getByRole("heading", { level: 1 }), what).toContainText("There is no");
  }
  await screenshot(page, "not-found-in-app");

  const ok = await page.goto(`/projects/${ayp}/pours/${own!.id}/insight`);
  expect(ok?.status()).toBe(200);
  // The engineer may read a pour's insight but not its schedule page, which is the admin's.
  expect((await page.goto(`/projects/${ayp}/pours/${own!.id}`))?.status()).toBe(404);
});

test("a bad invitation address is answered beside the box in our words, and nobody is invited", async ({ page }) => {
  const projectId = await demoProjectId();
  const address = `not-an-address-${stamp}`;
  await signInWithPassword(page, PEOPLE.admin);
  await page.waitForURL(/\/home$/);
  await page.goto(`/projects/${projectId}/members`);
  await page.getByLabel("E-mail").fill(address);
  await page.getByRole("button", { name: "Send invitation" }).click();
  // The form does not leave it to the browser's bubble: the server's message sits under the box.
  const error = page.locator("#invite-email-error");
  await expect(error).toBeVisible();
  await expect(page.getByLabel("E-mail")).toHaveAccessibleDescription(await error.innerText());
  expect(await queryDemo("select id from invitations where email = $1", [address])).toHaveLength(0);
  await screenshot(page, "members-invite-bad-address");
});
