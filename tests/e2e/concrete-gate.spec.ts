import { expect, test } from "@playwright/test";
import { screenshot } from "./support";
import { PEOPLE, apiAs, queryDemo, signInWithPassword } from "./people";
import { makePourFixture, pushEndA } from "./pour-fixture";

/**
 * The concrete gate of a pour, from the inspector's entry of the lab's results to a clean pour:
 * before results the pour's page says "do not stress"; the inspector enters a set in psi (the
 * demo project is a US one, 3,000 psi required before stressing); five tendons then
 * stressed in band raise no concrete flag. The pour is made for this spec.
 */

const stamp = Date.now().toString(36);

test("results entered by the inspector confirm the concrete: a pour of 5 tendons stressed afterwards has no concrete flag", async ({
  page,
}) => {
  test.setTimeout(120_000);
  const fx = await makePourFixture(
    `Concrete gate ${stamp}`,
    [1, 2, 3, 4, 5].map((i) => `CG-${stamp}-${i}`),
    // This pour starts without results.
    { concreteConfirmed: false },
  );

  await signInWithPassword(page, PEOPLE.inspector);
  await page.waitForURL(/\/home/);
  await page.goto(`/projects/${fx.projectId}/pours/${fx.pourId}/insight`);
  const gate = page.getByTestId("concrete-gate");
  await expect(gate.getByRole("status").first()).toContainText("Concrete not confirmed: do not stress");

  const form = gate.getByRole("form", { name: "Enter concrete results" });
  // A bad entry is refused with a message beside each box, and nothing is stored.
  await form.getByLabel(/Average strength of the set/).fill("strong");
  await form.getByLabel("Age at test (days)").fill("5");
  await form.getByRole("button", { name: "Save results" }).click();
  await expect(form.locator("#concrete-strength-error")).not.toBeEmpty();
  await expect(form.locator("#concrete-count-error")).toContainText("how many specimens");
  expect(await queryDemo("select id from concrete_results where pour_id = $1", [fx.pourId])).toHaveLength(0);

  await form.getByLabel(/Average strength of the set/).fill("3500");
  await form.getByLabel("Specimens broken").fill("3");
  await form.getByRole("button", { name: "Save results" }).click();
  await expect(gate.getByRole("status").first()).toContainText("Confirmed 3500 psi");
  await expect(gate.getByRole("table", { name: "Concrete results" })).toContainText("5 days");
  await screenshot(page, "concrete-gate-confirmed");

  const [pour] = await queryDemo<{ concrete_strength_mpa: number }>(
    "select concrete_strength_mpa from pours where id = $1",
    [fx.pourId],
  );
  // 3500 psi × 0.006894757 MPa/psi = 24.13 MPa (ASTM SI 10 conversion factor, from memory).
  expect(pour!.concrete_strength_mpa).toBeCloseTo(24.13, 2);

  const crew = await apiAs(PEOPLE.crew);
  for (const t of fx.tendons) expect((await pushEndA(crew, fx, t.id, 1.0)).result).toMatchObject({ status: "applied" });
  const flags = await queryDemo<{ kind: string }>("select kind from flags where pour_id = $1", [fx.pourId]);
  expect(flags.filter((f) => f.kind === "concrete_unconfirmed")).toHaveLength(0);
  expect(flags).toHaveLength(0);
  await crew.dispose();
});

test("stressed before results: one concrete flag for the pour, closed by results that confirm it", async () => {
  const fx = await makePourFixture(
    `Concrete late ${stamp}`,
    [1, 2, 3].map((i) => `CL-${stamp}-${i}`),
    { concreteConfirmed: false },
  );
  const crew = await apiAs(PEOPLE.crew);
  for (const t of fx.tendons) expect((await pushEndA(crew, fx, t.id, 1.0)).result).toMatchObject({ status: "applied" });
  const open = await queryDemo<{ status: string }>(
    "select status from flags where pour_id = $1 and kind = 'concrete_unconfirmed'",
    [fx.pourId],
  );
  expect(open).toEqual([{ status: "open" }]);

  const inspector = await apiAs(PEOPLE.inspector);
  const res = await inspector.post(`/api/projects/${fx.projectId}/pours/${fx.pourId}/concrete-results`, {
    data: { specimen: "cylinder", strengthMPa: 24, ageDays: 4, specimenCount: 2 },
  });
  expect(res.status()).toBe(201);
  expect(await res.json()).toMatchObject({ met: true, closedFlags: 1 });
  const after = await queryDemo<{ status: string }>(
    "select status from flags where pour_id = $1 and kind = 'concrete_unconfirmed'",
    [fx.pourId],
  );
  expect(after).toEqual([{ status: "closed" }]);
  await crew.dispose();
  await inspector.dispose();
});
