import { afterEach, describe, expect, it, vi } from "vitest";
import { saveRecord } from "./outbox";
import { PHOTO_NO_CONNECTION, uploadPhotos } from "./photo-upload";
import { samplePayload, signIn, testDb } from "./test-support";

afterEach(() => {
  vi.unstubAllGlobals();
});

describe("uploadPhotos without a connection", () => {
  it("keeps the photo and says so in words, not the browser's 'Failed to fetch'", async () => {
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
    vi.stubGlobal("fetch", async () => {
      throw new TypeError("Failed to fetch");
    });
    await uploadPhotos(db);
    const [photo] = await db.photos.toArray();
    expect(photo).toMatchObject({ state: "failed", lastError: PHOTO_NO_CONNECTION });
    db.close();
  });
});
