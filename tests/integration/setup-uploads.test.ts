import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import { seedDemo } from "@/scripts/seed/demo";
import { confirmUpload, presignUpload, readAttachment } from "@/lib/storage";
import { createTestDatabase, type TestDatabase } from "../support/database";
import { demoPerson } from "../support/records";

// Needs the upload fake (scripts/fakes.ts) that `npm test` starts, at S3_ENDPOINT.
let t: TestDatabase;
let projectId: string;
let otherProjectId: string;
let adminId: string;

const PDF = new TextEncoder().encode("%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n");
// A 1×1 PNG (the smallest valid image, written out byte by byte).
const PNG = Buffer.from(
  "89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da63f8cfc0f01f0005000201e5270ade0000000049454e44ae426082",
  "hex",
);

async function put(url: string, headers: Record<string, string>, body: Uint8Array) {
  const res = await fetch(url, { method: "PUT", headers, body: Buffer.from(body) });
  expect(res.status).toBe(200);
}

beforeAll(async () => {
  t = await createTestDatabase({ migrate: true });
  await seedDemo(t.db);
  projectId = (await t.db.selectFrom("projects").select("id").where("code", "=", "AYP").executeTakeFirstOrThrow()).id;
  otherProjectId = (await t.db.selectFrom("projects").select("id").where("code", "=", "QHM").executeTakeFirstOrThrow())
    .id;
  adminId = (await demoPerson(t.db, "admin@demo.tautline.test")).id;
});
afterAll(async () => {
  await t.drop();
});

describe("uploads", () => {
  it("store a certificate checked by content with its sha256, readable only through its own project", async () => {
    const started = await presignUpload(t.db, {
      projectId,
      purpose: "mill_certificate",
      contentType: "application/pdf",
      sizeBytes: PDF.byteLength,
      originalName: "../../etc/lot AY-0871.pdf",
      uploadedBy: adminId,
    });
    const pending = await t.db
      .selectFrom("attachments")
      .select(["status", "object_key", "original_name"])
      .where("id", "=", started.attachmentId)
      .executeTakeFirstOrThrow();
    expect(pending.status).toBe("pending");
    expect(pending.object_key).toContain(projectId);
    expect(pending.original_name).toBe("lot AY-0871.pdf");
    await expect(confirmUpload(t.db, { projectId, attachmentId: started.attachmentId })).rejects.toMatchObject({
      code: "CONFLICT",
    });

    await put(started.uploadUrl, started.headers, PDF);
    const stored = await confirmUpload(t.db, { projectId, attachmentId: started.attachmentId });
    expect(stored).toMatchObject({
      contentType: "application/pdf",
      sizeBytes: PDF.byteLength,
      sha256: createHash("sha256").update(PDF).digest("hex"),
    });
    // Confirming twice answers the same.
    expect(await confirmUpload(t.db, { projectId, attachmentId: started.attachmentId })).toEqual(stored);

    const read = await readAttachment(t.db, { projectId, attachmentId: started.attachmentId });
    expect(Buffer.from(read.body).equals(Buffer.from(PDF))).toBe(true);
    expect(read.headers["Content-Disposition"]).toMatch(/^attachment; filename="lot AY-0871.pdf"/);
    expect(read.headers["X-Content-Type-Options"]).toBe("nosniff");
    await expect(
      readAttachment(t.db, { projectId: otherProjectId, attachmentId: started.attachmentId }),
    ).rejects.toMatchObject({ code: "NOT_FOUND" });
  });

  it("delete and refuse a file whose content is not what its purpose allows", async () => {
    const started = await presignUpload(t.db, {
      projectId,
      purpose: "record_photo",
      contentType: "image/png",
      sizeBytes: PDF.byteLength,
      originalName: "gauge.png",
      uploadedBy: adminId,
    });
    await put(started.uploadUrl, started.headers, PDF); // a PDF named and typed as a PNG
    await expect(confirmUpload(t.db, { projectId, attachmentId: started.attachmentId })).rejects.toMatchObject({
      code: "INVALID_INPUT",
      fields: { file: expect.any(Array) },
    });
    expect(
      await t.db.selectFrom("attachments").select("id").where("id", "=", started.attachmentId).executeTakeFirst(),
    ).toBeUndefined();
  });

  it("accept a real image as a photo and refuse declared types and sizes outside the rules before any upload", async () => {
    const started = await presignUpload(t.db, {
      projectId,
      purpose: "record_photo",
      contentType: "image/png",
      sizeBytes: PNG.byteLength,
      originalName: "g.png",
      uploadedBy: adminId,
    });
    await put(started.uploadUrl, started.headers, PNG);
    expect((await confirmUpload(t.db, { projectId, attachmentId: started.attachmentId })).contentType).toBe(
      "image/png",
    );

    await expect(
      presignUpload(t.db, {
        projectId,
        purpose: "record_photo",
        contentType: "application/pdf",
        sizeBytes: 10,
        originalName: "x.pdf",
        uploadedBy: adminId,
      }),
    ).rejects.toMatchObject({ code: "INVALID_INPUT", fields: { contentType: expect.any(Array) } });
    await expect(
      presignUpload(t.db, {
        projectId,
        purpose: "mill_certificate",
        contentType: "application/pdf",
        sizeBytes: 10 ** 10,
        originalName: "x.pdf",
        uploadedBy: adminId,
      }),
    ).rejects.toMatchObject({ code: "INVALID_INPUT", fields: { file: expect.any(Array) } });
  });
});
