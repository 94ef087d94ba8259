import { presignUploadResponseSchema } from "@/lib/schemas/upload-response";
import type { FieldDb, LocalPhoto } from "./db";

/**
 * Uploads the photos of records the server has confirmed, one photo at a time: presign, PUT
 * straight to storage with progress, confirm. Each photo is its own unit of work, so a dropped
 * connection costs only the photo in flight, which starts again on the next round.
 */

function put(
  url: string,
  blob: Blob,
  headers: Record<string, string>,
  onProgress: (loaded: number) => void,
): Promise<number> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open("PUT", url);
    for (const [k, v] of Object.entries(headers)) xhr.setRequestHeader(k, v);
    xhr.upload.onprogress = (e) => onProgress(e.loaded);
    xhr.onload = () => resolve(xhr.status);
    xhr.onerror = () => reject(new Error("The upload lost its connection."));
    xhr.send(blob);
  });
}

async function uploadOne(db: FieldDb, photo: LocalPhoto): Promise<void> {
  await db.photos.update(photo.id, { state: "uploading", uploadedBytes: 0, lastError: null });
  const start = await fetch(`/api/projects/${photo.projectId}/uploads`, {
    method: "POST",
    headers: { "Content-Type": "application/json" },
    credentials: "same-origin",
    body: JSON.stringify({
      purpose: "record_photo",
      contentType: photo.contentType,
      sizeBytes: photo.sizeBytes,
      originalName: `${photo.id}.jpg`,
      recordId: photo.recordId,
    }),
  });
  if (!start.ok) throw new Error(`The server would not take the photo (${start.status}).`);
  const presigned = presignUploadResponseSchema.safeParse(await start.json().catch(() => null));
  if (!presigned.success) throw new Error(PHOTO_UNREADABLE);
  const { attachmentId, uploadUrl, headers } = presigned.data;
  await db.photos.update(photo.id, { attachmentId });
  let lastWrite = 0;
  const status = await put(uploadUrl, photo.blob, headers ?? {}, (loaded) => {
    // Progress goes to the tablet database a few times a second at most.
    if (Date.now() - lastWrite > 250) {
      lastWrite = Date.now();
      void db.photos.update(photo.id, { uploadedBytes: loaded });
    }
  });
  if (status < 200 || status >= 300) throw new Error(`Storage answered ${status}.`);
  const confirm = await fetch(`/api/projects/${photo.projectId}/uploads/${attachmentId}/confirm`, {
    method: "POST",
    credentials: "same-origin",
  });
  if (!confirm.ok) throw new Error(`The server did not accept the photo (${confirm.status}).`);
  await db.photos.update(photo.id, { state: "stored", uploadedBytes: photo.sizeBytes });
}

/** The server's answer to starting an upload does not match its contract: nothing is sent, the photo waits. */
export const PHOTO_UNREADABLE =
  "The server's answer could not be read, so the photo was not sent. It stays on this tablet and is sent later.";

export const PHOTO_NO_CONNECTION =
  "No connection to the server. The photo stays on this tablet and is sent when there is signal.";

let running: Promise<void> | null = null;

export function uploadPhotos(db: FieldDb): Promise<void> {
  running ??= (async () => {
    try {
      const waiting = await db.photos.where("state").anyOf("queued", "uploading", "failed").toArray();
      for (const photo of waiting) {
        const record = await db.records.get(photo.recordId);
        if (record?.syncState !== "synced") continue; // a photo follows its record
        try {
          await uploadOne(db, photo);
        } catch (error) {
          // fetch() fails with a TypeError whose words ("Failed to fetch") mean nothing to the crew.
          const lastError = error instanceof TypeError ? PHOTO_NO_CONNECTION : (error as Error).message;
          await db.photos.update(photo.id, { state: "failed", lastError });
        }
      }
    } finally {
      running = null;
    }
  })();
  return running;
}
