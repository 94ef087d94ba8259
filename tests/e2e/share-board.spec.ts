import { expect, test } from "@playwright/test";
import { PEOPLE, apiAs, queryDemo, signInWithPassword } from "./people";
import { screenshot } from "./support";

// The engineer makes a read-only link for the general contractor; a visitor with no account reads
// the status board, cannot change anything, and loses access when the link is revoked.

test("a read-only link shows the pours' status to the general contractor until it is revoked", async ({
  page,
  browser,
}) => {
  const [project] = await queryDemo<{ id: string }>("select id from projects where code = 'AYP'");
  await signInWithPassword(page, PEOPLE.engineer);
  await page.waitForURL(/\/home/);
  await page.goto(`/projects/${project!.id}/share`);
  const form = page.getByRole("form", { name: "Make a read-only link" });
  await form.getByLabel("Who it is for").fill("General contractor (demo)");
  await form.getByLabel("Works for (days)").fill("400");
  await form.getByRole("button", { name: "Make link" }).click();
  await expect(form.locator("#share-days-error")).toContainText("at most 180 days");
  await form.getByLabel("Works for (days)").fill("14");
  await form.getByRole("button", { name: "Make link" }).click();
  const url = (await page.getByTestId("share-url").textContent())!;
  expect(url).toMatch(/\/share\/[A-Za-z0-9_-]{43}$/);
  await screenshot(page, "share-links");

  const visitor = await browser.newContext();
  const board = await visitor.newPage();
  await board.goto(new URL(url).pathname);
  await expect(board.getByRole("heading", { name: /Alder Yard Parking \(AYP\)/ })).toBeVisible();
  // The demo's pours (other specs may have added more).
  for (const name of ["L2 Pour 1", "L2 Pour 2", "L3 Pour 1"])
    await expect(board.locator(`[data-pour="${name}"]`)).toBeVisible();
  await expect(board.locator('[data-pour="L2 Pour 1"] [data-status]')).toHaveText(
    /Released|Held|Stressed|Stressing|Planned/,
  );
  // Nothing to change: no form, no button, and the API answers no write.
  await expect(board.locator("form, button, input, textarea")).toHaveCount(0);
  await screenshot(board, "share-board");
  const token = new URL(url).pathname.split("/").pop()!;
  const pourId = (await queryDemo<{ id: string }>("select id from pours where name = 'L2 Pour 1'"))[0]!.id;
  const write = await board.request.post(`/api/share/${token}/reports/${pourId}/1`, { data: {} });
  expect(write.status()).toBe(405);

  // Revoked: the board and the files are gone at once.
  const engineerApi = await apiAs(PEOPLE.engineer);
  const list = (await (await engineerApi.get(`/api/projects/${project!.id}/share-links`)).json()) as {
    links: { id: string; label: string; state: string }[];
  };
  const link = list.links.find((l) => l.label === "General contractor (demo)" && l.state === "active")!;
  expect((await engineerApi.delete(`/api/projects/${project!.id}/share-links/${link.id}`)).status()).toBe(200);
  await board.reload();
  await expect(board.getByRole("heading", { name: "This link has ended" })).toBeVisible();
  expect((await board.request.get(`/api/share/${token}/reports/${pourId}/1`)).status()).toBe(410);
  const views = await queryDemo<{ n: string }>(
    "select count(*) as n from audit_events where action = 'share.view' and target = $1",
    [`share:${link.id}`],
  );
  expect(Number(views[0]!.n)).toBeGreaterThanOrEqual(2);
  await visitor.close();
});
