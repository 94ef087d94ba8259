import { expect, test } from "@playwright/test";
import { screenshot } from "./support";
import { queryDemo } from "./people";
import { shortTendonDecided } from "./pour-fixture";
import { heldTendonOffline, tendonFlagsAsEngineer } from "./field-steps";

/**
 * A detension from order to office: a tendon reads short and is flagged; the engineer orders a
 * detension and restress; the crew's tablet (portrait, 800 × 1280) shows the order after the
 * sync; with no signal the crew records the detension in the hold panel (too many strands is
 * refused first and nothing is saved); back online the sync sends it once, the tendon stays
 * held as "detensioned: restress required", and the engineer's tendon page shows it beside the
 * disposition. On the way: the restress form offers only the end the tendon is stressed from, and
 * the record photo link on the engineer's page answers with the photo. The pour is made for this spec.
 */

test.use({ viewport: { width: 800, height: 1280 }, hasTouch: true });

const stamp = Date.now().toString(36);
const POUR = `Detension ${stamp}`;
/** A 1 × 1 PNG: enough for the upload's check by content. */
const PNG = Buffer.from(
  "iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==",
  "base64",
);

test("the crew records an ordered detension offline; the tendon stays held and the office sees it", async ({
  browser,
}) => {
  test.setTimeout(150_000);
  const { fx, tendon, crewApi, engineerApi, flagId, recordId } = await shortTendonDecided(
    POUR,
    `DT-${stamp}-1`,
    "detension_restress",
    "Short by about 15 %: release the strand, check the sheathing at the live end, then stress it again.",
  );

  // A gauge photo with the record, uploaded as the tablet does (presign, PUT, confirm).
  const started = await crewApi.post(`/api/projects/${fx.projectId}/uploads`, {
    data: {
      purpose: "record_photo",
      contentType: "image/png",
      sizeBytes: PNG.byteLength,
      originalName: "gauge.png",
      recordId,
    },
  });
  expect(started.status()).toBe(201);
  const upload = (await started.json()) as { attachmentId: string; uploadUrl: string; headers: Record<string, string> };
  expect((await fetch(upload.uploadUrl, { method: "PUT", headers: upload.headers, body: PNG })).status).toBe(200);
  expect((await crewApi.post(`/api/projects/${fx.projectId}/uploads/${upload.attachmentId}/confirm`)).status()).toBe(
    200,
  );

  const [strands] = await queryDemo<{ strand_count: number; ends: string }>(
    "select strand_count, ends from tendons where id = $1",
    [tendon.id],
  );

  // The signal goes; the detension is recorded on the tablet all the same.
  const { ctx, crew, rows, panel } = await heldTendonOffline(
    browser,
    POUR,
    "Held · detension and restress ordered",
    "Record the detension",
  );
  const section = panel.getByTestId("detension");
  await section.getByTestId("detension-open").click();
  const form = section.getByTestId("detension-form");
  await form.getByRole("radio", { name: new RegExp(fx.setName) }).check();
  await form.getByTestId("detension-pressure").fill("1200");
  await form
    .getByTestId("detension-remarks")
    .fill("Wedges released with the jack; sheathing split 300 mm from the live end.");
  // More strands than the tendon has is refused, naming the box; nothing is saved.
  await form.getByTestId("detension-strands").fill(String(strands!.strand_count + 1));
  await form.getByTestId("detension-save").click();
  await expect(form.getByRole("alert")).toContainText(`has ${strands!.strand_count} strand`);
  await expect(form.getByTestId("detension-strands")).toHaveAttribute("aria-invalid", "true");
  await expect(section.getByTestId("detension-item")).toHaveCount(0);
  await screenshot(crew, "field-detension-refused-portrait");

  await form.getByTestId("detension-strands").fill(String(strands!.strand_count));
  await form.getByTestId("detension-save").click();
  const item = section.getByTestId("detension-item");
  await expect(item).toHaveCount(1);
  await expect(item.getByTestId("detension-state")).toContainText("waiting to send");
  await expect(item).toContainText("Gauge at release: 1200 psi");
  await expect(section.getByTestId("detension-restress-required")).toContainText("restress required at end A");
  await expect(crew.getByTestId("pending-count")).toContainText("1");
  await screenshot(crew, "field-detension-saved-offline-portrait");
  expect(await queryDemo("select id from detensions where tendon_id = $1", [tendon.id])).toHaveLength(0);

  // Back in signal: the sync sends it, once.
  await ctx.setOffline(false);
  await crew.getByRole("button", { name: "Sync now" }).click();
  await expect(item.getByTestId("detension-state")).toContainText("received by the server", { timeout: 20_000 });
  await crew.getByRole("button", { name: "Sync now" }).click();
  const stored = await queryDemo<{ disposition_id: string; strands_detensioned: number }>(
    "select disposition_id, strands_detensioned from detensions where tendon_id = $1",
    [tendon.id],
  );
  expect(stored).toHaveLength(1);
  expect(stored[0]!.strands_detensioned).toBe(strands!.strand_count);
  const [order] = await queryDemo<{ id: string }>("select id from dispositions where flag_id = $1", [flagId]);
  expect(stored[0]!.disposition_id).toBe(order!.id);

  // Held until the restress: the list says so and the tails stay uncut.
  await expect(rows.first().getByTestId("hold-summary")).toHaveText("Held · detensioned: restress required");
  await expect(crew.getByTestId("tail-held-reasons")).toContainText("Detensioned: restress required");
  await screenshot(crew, "field-detension-held-portrait");

  // The restress form offers only the end this tendon is stressed from.
  await crew.getByRole("button", { name: "Record a restress" }).click();
  const endChoices = crew.locator('input[type="radio"][name="tendonEnd"]');
  await expect(endChoices).toHaveCount(strands!.ends === "both" ? 2 : 1);
  if (strands!.ends !== "both") await expect(endChoices.first()).toHaveAttribute("value", strands!.ends);

  // The engineer's tendon page shows the detension beside the disposition that ordered it.
  const { office, engineer } = await tendonFlagsAsEngineer(browser, fx.projectId, tendon.id);
  const shown = engineer.getByTestId("detension-record");
  await expect(shown).toContainText(`${strands!.strand_count} of ${strands!.strand_count} strand`);
  await expect(shown).toContainText("Gauge at release: 1200 psi");
  await expect(shown).toContainText("sheathing split");
  await expect(engineer.getByTestId("detension-restress-state")).toContainText("Held: restress required at end A");
  await shown.scrollIntoViewIfNeeded();
  await screenshot(engineer, "office-detension-beside-disposition");

  // The record's photo link answers with the photo.
  const photo = engineer.getByRole("link", { name: "Photo 1" });
  const href = await photo.getAttribute("href");
  expect(href).toBe(`/api/projects/${fx.projectId}/attachments/${upload.attachmentId}`);
  const answer = await engineer.request.get(href!);
  expect(answer.status()).toBe(200);
  expect(answer.headers()["content-type"]).toBe("image/png");
  expect(Buffer.from(await answer.body()).equals(PNG)).toBe(true);

  await office.close();
  await ctx.close();
  await crewApi.dispose();
  await engineerApi.dispose();
});
