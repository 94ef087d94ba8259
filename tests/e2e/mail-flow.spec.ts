import { expect, test } from "@playwright/test";
import { screenshot } from "./support";
import { PEOPLE, queryDemo, signInWithPassword } from "./people";

/**
 * The engineer sees when a flag's e-mail could not be sent after every retry: a banner on every
 * office screen names the tendon and links to its flags. Crew never see it.
 */
test("a flag e-mail given up after every retry is shown to the engineer with its tendon", async ({ page, browser }) => {
  const [flag] = await queryDemo<{ id: string; project_id: string; tendon_id: string; tag: string }>(
    `select f.id, f.project_id, f.tendon_id, t.tag from flags f join tendons t on t.id = f.tendon_id
     join projects p on p.id = f.project_id where p.code = 'AYP' order by f.created_at limit 1`,
  );
  expect(flag).toBeDefined();
  const key = `e2e-failed-${Date.now()}`;
  await queryDemo(
    `insert into notifications (project_id, flag_id, dedupe_key, to_emails, subject, text_body, html_body, status, attempts, last_error)
     values ($1, $2, $3, array['engineer@demo.tautline.test'], 'Flag on tendon', 'x', '<p>x</p>', 'failed', 10, 'relay refused the message')`,
    [flag!.project_id, flag!.id, key],
  );
  try {
    await signInWithPassword(page, PEOPLE.engineer);
    await page.waitForURL(/\/home/);
    const banner = page.getByRole("alert", { name: "E-mail is not going out" });
    await expect(banner).toContainText("could not be sent after every retry");
    await expect(banner.getByRole("link", { name: `Tendon ${flag!.tag}` })).toHaveAttribute(
      "href",
      `/projects/${flag!.project_id}/tendons/${flag!.tendon_id}/flags`,
    );
    await expect(banner).toContainText("relay refused the message");
    await screenshot(page, "mail-flow-banner-engineer");

    const crew = await browser.newContext();
    const crewPage = await crew.newPage();
    await signInWithPassword(crewPage, PEOPLE.crew);
    await crewPage.waitForURL(/\/home/);
    await expect(crewPage.getByRole("heading", { name: "Today", exact: true })).toBeVisible();
    await expect(crewPage.getByRole("alert", { name: "E-mail is not going out" })).toHaveCount(0);
    await crew.close();
  } finally {
    await queryDemo("delete from notifications where dedupe_key = $1", [key]);
  }
});
