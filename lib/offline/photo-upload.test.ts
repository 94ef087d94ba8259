import { afterEach, describe, expect, it, vi } from "vitest";
import { saveRecord } from "./outbox";
import { PHOTO_NO_CONNECTION, PHOTO_UNREADABLE, uploadPhotos } from "./photo-upload";
import { samplePayload, signIn, testDb } from "./test-support";

afterEach(() => {
  vi.unstubAllGlobals();
});

async function tabletWithPhoto() {
  const { db } = testDb();
  await signIn(db);
  const s = samplePayload();
  await saveRecord(db, { ...s, authorName: "Test Crew", local: null });
  await db.records.update(s.recordId, { syncState: "synced" });
  await db.photos.add({
    id: crypto.randomUUID(),
    recordId: s.recordId,
    projectId: s.payload.projectId,
    blob: new Blob([new Uint8Array([0xff, 0xd8, 0xff])], { type: "image/jpeg" }),
    contentType: "image/jpeg",
    sizeBytes: 3,
    width: 1,
    height: 1,
    takenAt: new Date().toISOString(),
    state: "queued",
    uploadedBytes: 0,
  });
  return db;
}

describe("uploadPhotos without a connection", () => {
  it("keeps the photo and says so in words, not the browser's 'Failed to fetch'", async () => {
    const db = await tabletWithPhoto();
    vi.stubGlobal("fetch", async () => {
      throw new TypeError("Failed to fetch");
    });
    await uploadPhotos(db);
    const [photo] = await db.photos.toArray();
    expect(photo).toMatchObject({ state: "failed", lastError: PHOTO_NO_CONNECTION });
    db.close();
  });
});

describe("uploadPhotos when the server's answer to starting the upload breaks its contract", () => {
  it("sends nothing to storage, keeps the photo and says so in words", async () => {
    const db = await tabletWithPhoto();
    const calls: string[] = [];
    vi.stubGlobal("fetch", async (url: string) => {
      calls.push(url);
      return new Response(JSON.stringify({ attachmentId: 5, uploadUrl: null }), { status: 201 });
    });
    await uploadPhotos(db);
    const [photo] = await db.photos.toArray();
    expect(photo).toMatchObject({ state: "failed", lastError: PHOTO_UNREADABLE });
    expect(photo!.attachmentId).toBeUndefined();
    expect(calls).toHaveLength(1);
    db.close();
  });
});
