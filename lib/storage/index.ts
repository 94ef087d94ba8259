import "server-only";
import { createHash, randomUUID } from "node:crypto";
import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand } from "@aws-sdk/client-s3";
import { getSignedUrl } from "@aws-sdk/s3-request-presigner";
import { fileTypeFromBuffer } from "file-type";
import type { Kysely, Transaction } from "kysely";
import type { Database } from "@/db/types";
import type { AttachmentPurpose } from "@/lib/schemas/domain";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { ALLOWED_TYPES, PURPOSE_LABELS, acceptedTypesText } from "@/lib/schemas/upload";
import { bucket, s3 } from "./client";

/**
 * Uploads: the browser PUTs the file straight to the S3-compatible store on a presigned URL,
 * then asks the server to confirm it. Confirmation reads the object back, checks its type by
 * content against the purpose's allow-list and its size against UPLOAD_MAX_BYTES, keeps the
 * sha256 and marks the row stored; anything else is deleted and refused. Downloads go through
 * an authorized route that calls readAttachment.
 */

type Db = Kysely<Database> | Transaction<Database>;

/** How long a presigned PUT stays usable. */
const PRESIGN_SECONDS = 10 * 60;

/** Unconfirmed uploads older than this are deleted with their objects (cleanPendingUploads). */
export const PENDING_UPLOAD_TTL_MS = 24 * 60 * 60 * 1000;

/**
 * Where a confirmed file lives: a key no presigned URL was ever issued for, so a PUT on the
 * upload's still-valid URL can no longer change the evidence.
 */
export const finalKey = (uploadKey: string) => `${uploadKey.replace(/\/upload$/, "")}/confirmed`;

export interface StoredAttachment {
  id: string;
  purpose: AttachmentPurpose;
  contentType: string;
  sizeBytes: number;
  sha256: string;
  originalName: string | null;
}

/** A file name safe to put in a header and to show: no path, no control characters. */
export function safeFileName(name: string | null | undefined, fallback = "file"): string {
  const base = (name ?? "").split(/[\\/]/).pop() ?? "";
  const cleaned = base
    .replace(/[\u0000-\u001f\u007f"]/g, "")
    .trim()
    .slice(0, 200);
  return cleaned || fallback;
}

function tooBig(size: number): AppError {
  const mb = (env.UPLOAD_MAX_BYTES / 1024 / 1024).toFixed(0);
  return new AppError("INVALID_INPUT", `The file is ${(size / 1024 / 1024).toFixed(1)} MB; the limit is ${mb} MB.`, {
    file: [`Files may be at most ${mb} MB.`],
  });
}

export async function presignUpload(
  db: Db,
  input: {
    projectId: string;
    purpose: AttachmentPurpose;
    contentType: string;
    sizeBytes: number;
    originalName: string;
    uploadedBy: string;
    recordId?: string;
  },
): Promise<{ attachmentId: string; uploadUrl: string; headers: Record<string, string>; expiresInSeconds: number }> {
  if (!ALLOWED_TYPES[input.purpose].includes(input.contentType)) {
    throw new AppError(
      "INVALID_INPUT",
      `A ${PURPOSE_LABELS[input.purpose]} must be ${acceptedTypesText(input.purpose)}.`,
      {
        contentType: [`Use ${acceptedTypesText(input.purpose)}.`],
      },
    );
  }
  if (input.sizeBytes > env.UPLOAD_MAX_BYTES) throw tooBig(input.sizeBytes);
  const attachment = newAttachment({
    ...input,
    name: input.originalName,
    by: input.uploadedBy,
    keySuffix: "/upload",
  });
  await db
    .insertInto("attachments")
    .values({ ...attachment, status: "pending", record_id: input.recordId ?? null })
    .execute();
  const uploadUrl = await getSignedUrl(
    s3(),
    new PutObjectCommand({ Bucket: bucket(), Key: attachment.object_key, ContentType: input.contentType }),
    {
      expiresIn: PRESIGN_SECONDS,
    },
  );
  return {
    attachmentId: attachment.id,
    uploadUrl,
    headers: { "Content-Type": input.contentType },
    expiresInSeconds: PRESIGN_SECONDS,
  };
}

/**
 * A new attachment's row: a fresh id, its object key under the project and the purpose (`keySuffix`
 * for a browser's upload), the file's name made safe, and who brought it.
 */
function newAttachment(input: {
  projectId: string;
  purpose: AttachmentPurpose;
  contentType: string;
  sizeBytes: number;
  name: string;
  by: string;
  keySuffix?: string;
}) {
  const id = randomUUID();
  return {
    id,
    project_id: input.projectId,
    purpose: input.purpose,
    object_key: `projects/${input.projectId}/${input.purpose}/${id}${input.keySuffix ?? ""}`,
    content_type: input.contentType,
    size_bytes: input.sizeBytes,
    original_name: safeFileName(input.name),
    uploaded_by: input.by,
  };
}

async function readObject(key: string): Promise<Uint8Array | null> {
  try {
    const object = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key }));
    if (object.ContentLength !== undefined && object.ContentLength > env.UPLOAD_MAX_BYTES) {
      object.Body?.transformToWebStream()
        .cancel()
        .catch(() => undefined);
      throw tooBig(object.ContentLength);
    }
    return (await object.Body?.transformToByteArray()) ?? null;
  } catch (error) {
    if (error instanceof AppError) throw error;
    const name = (error as { name?: string }).name;
    if (name === "NoSuchKey" || name === "NotFound") return null;
    throw error;
  }
}

async function discard(db: Db, projectId: string, attachmentId: string, key: string): Promise<void> {
  await s3().send(new DeleteObjectCommand({ Bucket: bucket(), Key: key }));
  await db.deleteFrom("attachments").where("project_id", "=", projectId).where("id", "=", attachmentId).execute();
}

function toStored(row: {
  id: string;
  purpose: AttachmentPurpose;
  content_type: string;
  size_bytes: number;
  sha256: string | null;
  original_name: string | null;
}): StoredAttachment {
  return {
    id: row.id,
    purpose: row.purpose,
    contentType: row.content_type,
    sizeBytes: Number(row.size_bytes),
    sha256: row.sha256 ?? "",
    originalName: row.original_name,
  };
}

/** What an upload of the project is for (to authorize its confirmation); 404 when there is none. */
export async function attachmentPurpose(
  db: Db,
  input: { projectId: string; attachmentId: string },
): Promise<AttachmentPurpose> {
  const row = await db
    .selectFrom("attachments")
    .select("purpose")
    .where("project_id", "=", input.projectId)
    .where("id", "=", input.attachmentId)
    .executeTakeFirst();
  if (!row) throw new AppError("NOT_FOUND", "No such upload on this project.");
  return row.purpose;
}

/**
 * Checks what the browser put at the presigned URL. A confirmed upload answers the same again
 * (idempotent); a missing object answers 409 (upload first); a wrong type or size deletes the
 * object and the row and answers 422.
 */
export async function confirmUpload(
  db: Db,
  input: { projectId: string; attachmentId: string },
): Promise<StoredAttachment> {
  const row = await db
    .selectFrom("attachments")
    .select(["id", "purpose", "object_key", "content_type", "size_bytes", "sha256", "original_name", "status"])
    .where("project_id", "=", input.projectId)
    .where("id", "=", input.attachmentId)
    .executeTakeFirst();
  if (!row) throw new AppError("NOT_FOUND", "No such upload on this project.");
  if (row.status === "stored") return toStored(row);

  let bytes: Uint8Array | null;
  try {
    bytes = await readObject(row.object_key);
  } catch (error) {
    if (error instanceof AppError) await discard(db, input.projectId, row.id, row.object_key);
    throw error;
  }
  if (!bytes)
    throw new AppError("CONFLICT", "The file has not arrived yet. Upload it, then confirm.", {
      file: ["Not uploaded yet."],
    });
  if (bytes.byteLength === 0) {
    await discard(db, input.projectId, row.id, row.object_key);
    throw new AppError("INVALID_INPUT", "The file is empty.", { file: ["The file is empty."] });
  }
  if (bytes.byteLength > env.UPLOAD_MAX_BYTES) {
    await discard(db, input.projectId, row.id, row.object_key);
    throw tooBig(bytes.byteLength);
  }
  const detected = await fileTypeFromBuffer(bytes);
  const allowed = ALLOWED_TYPES[row.purpose];
  if (!detected || !allowed.includes(detected.mime)) {
    await discard(db, input.projectId, row.id, row.object_key);
    const what = detected ? `looks like ${detected.mime}` : "is not a file type we recognise";
    throw new AppError(
      "INVALID_INPUT",
      `This ${PURPOSE_LABELS[row.purpose]} ${what}; use ${acceptedTypesText(row.purpose)}.`,
      {
        file: [`Use ${acceptedTypesText(row.purpose)}.`],
      },
    );
  }
  const sha256 = createHash("sha256").update(bytes).digest("hex");
  // The bytes just checked are copied to the final key, and the upload key is emptied: the
  // presigned PUT may stay valid for minutes more, but it now writes where nothing reads.
  const confirmedKey = finalKey(row.object_key);
  await s3().send(
    new PutObjectCommand({ Bucket: bucket(), Key: confirmedKey, Body: bytes, ContentType: detected.mime }),
  );
  await s3().send(new DeleteObjectCommand({ Bucket: bucket(), Key: row.object_key }));
  const stored = await db
    .updateTable("attachments")
    .set({
      status: "stored",
      sha256,
      content_type: detected.mime,
      size_bytes: bytes.byteLength,
      object_key: confirmedKey,
    })
    .where("project_id", "=", input.projectId)
    .where("id", "=", row.id)
    .returning(["id", "purpose", "content_type", "size_bytes", "sha256", "original_name"])
    .executeTakeFirstOrThrow();
  return toStored(stored);
}

/** A stored file's bytes and the headers to send it with; 404 for pending, missing or other projects' files. */
export async function readAttachment(
  db: Db,
  input: { projectId: string; attachmentId: string },
): Promise<{ attachment: StoredAttachment; body: Uint8Array; headers: Record<string, string> }> {
  const row = await db
    .selectFrom("attachments")
    .select(["id", "purpose", "object_key", "content_type", "size_bytes", "sha256", "original_name"])
    .where("project_id", "=", input.projectId)
    .where("id", "=", input.attachmentId)
    .where("status", "=", "stored")
    .executeTakeFirst();
  if (!row) throw new AppError("NOT_FOUND", "No such file on this project.");
  const body = await readObject(row.object_key);
  if (!body) throw new AppError("NOT_FOUND", "The file is missing from storage.");
  // Evidence is immutable: bytes that no longer match the hash kept at confirmation are refused.
  if (row.sha256 && createHash("sha256").update(body).digest("hex") !== row.sha256) {
    console.error(`attachment ${row.id}: stored bytes no longer match their sha256; refused`);
    throw new AppError(
      "CONFLICT",
      "This file was changed in storage after it was confirmed, so it is not served. Tell the project admin.",
    );
  }
  const name = safeFileName(row.original_name, `${row.purpose}-${row.id}`);
  const ascii = name.replace(/[^\x20-\x7e]/g, "_");
  return {
    attachment: toStored(row),
    body,
    headers: {
      "Content-Type": row.content_type,
      "Content-Length": String(body.byteLength),
      "Content-Disposition": `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name)}`,
      "X-Content-Type-Options": "nosniff",
      "Content-Security-Policy": "sandbox; default-src 'none'",
      "Cache-Control": "private, no-store",
      ...(row.sha256 ? { "X-Content-SHA256": row.sha256 } : {}),
    },
  };
}

/** Checks that an attachment is stored on the project for one of the purposes, before a row links to it. */
export async function requireStoredAttachment(
  db: Db,
  input: { projectId: string; attachmentId: string; purpose: AttachmentPurpose; field: string },
): Promise<void> {
  const row = await db
    .selectFrom("attachments")
    .select("id")
    .where("project_id", "=", input.projectId)
    .where("id", "=", input.attachmentId)
    .where("purpose", "=", input.purpose)
    .where("status", "=", "stored")
    .executeTakeFirst();
  if (!row) {
    throw new AppError("INVALID_INPUT", `The ${PURPOSE_LABELS[input.purpose]} file is not uploaded on this project.`, {
      [input.field]: ["Upload the file first."],
    });
  }
}

/**
 * Stores a file the server made itself (a signed report) in the upload store: the bytes go up
 * under a generated key and the row is written `stored` with the file's sha256. Returns the row.
 */
export async function storeGeneratedFile(
  db: Db,
  input: {
    projectId: string;
    purpose: "signed_report";
    contentType: string;
    bytes: Uint8Array;
    name: string;
    createdBy: string;
  },
): Promise<StoredAttachment> {
  const attachment = newAttachment({ ...input, sizeBytes: input.bytes.byteLength, by: input.createdBy });
  const sha256 = createHash("sha256").update(input.bytes).digest("hex");
  await s3().send(
    new PutObjectCommand({
      Bucket: bucket(),
      Key: attachment.object_key,
      Body: input.bytes,
      ContentType: input.contentType,
    }),
  );
  const row = await db
    .insertInto("attachments")
    .values({ ...attachment, sha256, status: "stored" })
    .returning(["id", "purpose", "content_type", "size_bytes", "sha256", "original_name"])
    .executeTakeFirstOrThrow();
  return toStored(row);
}

/**
 * Deletes uploads that were never confirmed within a day, objects and rows; returns how many.
 * The e-mail dispatcher runs it every hour. A row something still points at is left alone.
 */
export async function cleanPendingUploads(db: Db, now = new Date()): Promise<number> {
  const stale = await db
    .selectFrom("attachments")
    .select(["id", "project_id", "object_key"])
    .where("status", "=", "pending")
    .where("created_at", "<", new Date(now.getTime() - PENDING_UPLOAD_TTL_MS))
    .limit(500)
    .execute();
  let cleaned = 0;
  for (const row of stale) {
    try {
      await db.deleteFrom("attachments").where("project_id", "=", row.project_id).where("id", "=", row.id).execute();
    } catch {
      continue;
    }
    await s3()
      .send(new DeleteObjectCommand({ Bucket: bucket(), Key: row.object_key }))
      .catch(() => undefined);
    cleaned++;
  }
  return cleaned;
}
