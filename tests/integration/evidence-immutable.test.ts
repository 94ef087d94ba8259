import { createHash } from "node:crypto";
import { PutObjectCommand } from "@aws-sdk/client-s3";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "@/scripts/seed/demo";
import { cleanPendingUploads, confirmUpload, presignUpload, readAttachment } from "@/lib/storage";
import { bucket, s3 } from "@/lib/storage/client";
import { createTestDatabase, type TestDatabase } from "../support/database";
import { demoPerson } from "../support/records";

// Before: a confirmed certificate could be replaced through its still-valid presigned URL while
// the stored hash stayed the old one. Now confirmation copies the checked bytes to a key no URL
// was issued for, downloads check the sha256, and uploads never confirmed are cleaned after a day.
// Needs the upload fake (scripts/fakes.ts) that `npm test` starts, at S3_ENDPOINT.

let t: TestDatabase;
let projectId: string;
let adminId: string;
const PDF = new TextEncoder().encode("%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n");
const FORGED = new TextEncoder().encode("%PDF-1.4\n% a different certificate\ntrailer<<>>\n%%EOF\n");
const sha = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");

beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
  await seedDemo(t.db);
  projectId = (await t.db.selectFrom("projects").select("id").where("code", "=", "AYP").executeTakeFirstOrThrow()).id;
  adminId = (await demoPerson(t.db, "admin@demo.tautline.test")).id;
});
afterAll(async () => {
  await t.drop();
});

async function startUpload() {
  return presignUpload(t.db, {
    projectId,
    purpose: "mill_certificate",
    contentType: "application/pdf",
    sizeBytes: PDF.byteLength,
    originalName: "lot.pdf",
    uploadedBy: adminId,
  });
}

describe("evidence is immutable once confirmed", () => {
  it("a PUT on the still-valid presigned URL after confirmation does not change what is served", async () => {
    const started = await startUpload();
    expect(
      (await fetch(started.uploadUrl, { method: "PUT", headers: started.headers, body: Buffer.from(PDF) })).status,
    ).toBe(200);
    const stored = await confirmUpload(t.db, { projectId, attachmentId: started.attachmentId });
    expect(stored.sha256).toBe(sha(PDF));

    // The attacker's replacement, on the URL that is still within its lifetime.
    const replaced = await fetch(started.uploadUrl, {
      method: "PUT",
      headers: started.headers,
      body: Buffer.from(FORGED),
    });
    expect(replaced.status).toBe(200);
    const read = await readAttachment(t.db, { projectId, attachmentId: started.attachmentId });
    expect(sha(read.body)).toBe(sha(PDF));
    expect(read.headers["X-Content-SHA256"]).toBe(sha(PDF));
  });

  it("bytes changed in storage behind the app's back are refused on download, not served", async () => {
    const started = await startUpload();
    await fetch(started.uploadUrl, { method: "PUT", headers: started.headers, body: Buffer.from(PDF) });
    await confirmUpload(t.db, { projectId, attachmentId: started.attachmentId });
    const row = await t.db
      .selectFrom("attachments")
      .select("object_key")
      .where("id", "=", started.attachmentId)
      .executeTakeFirstOrThrow();
    expect(row.object_key).toMatch(/\/confirmed$/);
    await s3().send(
      new PutObjectCommand({ Bucket: bucket(), Key: row.object_key, Body: FORGED, ContentType: "application/pdf" }),
    );
    await expect(readAttachment(t.db, { projectId, attachmentId: started.attachmentId })).rejects.toMatchObject({
      code: "CONFLICT",
      message: expect.stringContaining("changed in storage"),
    });
  });

  it("uploads never confirmed are deleted after a day, rows and objects; younger ones and stored ones stay", async () => {
    const old = await startUpload();
    await fetch(old.uploadUrl, { method: "PUT", headers: old.headers, body: Buffer.from(PDF) });
    const young = await startUpload();
    await t.db
      .updateTable("attachments")
      .set({ created_at: new Date(Date.now() - 25 * 3600_000) })
      .where("id", "=", old.attachmentId)
      .execute();
    const storedBefore = await t.db.selectFrom("attachments").select("id").where("status", "=", "stored").execute();

    expect(await cleanPendingUploads(t.db)).toBe(1);
    const left = await t.db
      .selectFrom("attachments")
      .select("id")
      .where("id", "in", [old.attachmentId, young.attachmentId])
      .execute();
    expect(left.map((r) => r.id)).toEqual([young.attachmentId]);
    expect(await t.db.selectFrom("attachments").select("id").where("status", "=", "stored").execute()).toHaveLength(
      storedBefore.length,
    );
    // The object went with the row: confirming now finds nothing.
    await expect(confirmUpload(t.db, { projectId, attachmentId: old.attachmentId })).rejects.toMatchObject({
      code: "NOT_FOUND",
    });
  });
});
