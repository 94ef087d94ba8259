import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { newToken } from "@/lib/auth/tokens";
import { AppError } from "@/lib/errors";
import type { ShareLinkInput } from "@/lib/schemas/share-link";
import { recordAudit } from "./record-audit";

/**
 * Read-only links to a project's status board. The token is shown once, when the link is made;
 * only its sha256 is stored. A link ends at its expiry or when revoked, whichever comes first.
 */

export async function createShareLink(
  db: Kysely<Database>,
  input: { projectId: string; by: { id: string }; values: ShareLinkInput; now?: Date },
): Promise<{ linkId: string; token: string; expiresAt: Date }> {
  const { token, hash } = newToken();
  const expiresAt = new Date((input.now ?? new Date()).getTime() + input.values.days * 86_400_000);
  const row = await db
    .insertInto("share_links")
    .values({
      project_id: input.projectId,
      token_sha256: hash,
      label: input.values.label,
      created_by: input.by.id,
      expires_at: expiresAt,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  await recordAudit(db, {
    action: "share.create",
    outcome: "success",
    actorUserId: input.by.id,
    projectId: input.projectId,
    target: `share:${row.id}`,
    detail: { label: input.values.label, expiresAt: expiresAt.toISOString() },
  });
  return { linkId: row.id, token, expiresAt };
}

export async function listShareLinks(db: Kysely<Database>, input: { projectId: string; now?: Date }) {
  const now = input.now ?? new Date();
  const rows = await db
    .selectFrom("share_links")
    .leftJoin("users", "users.id", "share_links.created_by")
    .select([
      "share_links.id",
      "share_links.label",
      "share_links.created_at",
      "share_links.expires_at",
      "share_links.revoked_at",
      "users.name as createdBy",
    ])
    .where("share_links.project_id", "=", input.projectId)
    .orderBy("share_links.created_at", "desc")
    .execute();
  return {
    links: rows.map((r) => ({
      id: r.id,
      label: r.label,
      createdBy: r.createdBy,
      createdAt: new Date(r.created_at),
      expiresAt: new Date(r.expires_at),
      revokedAt: r.revoked_at ? new Date(r.revoked_at) : null,
      state: r.revoked_at
        ? ("revoked" as const)
        : new Date(r.expires_at) <= now
          ? ("expired" as const)
          : ("active" as const),
    })),
  };
}

export async function revokeShareLink(
  db: Kysely<Database>,
  input: { projectId: string; linkId: string; by: { id: string } },
): Promise<{ revokedAt: Date }> {
  const row = await db
    .updateTable("share_links")
    .set({ revoked_at: new Date(), revoked_by: input.by.id })
    .where("project_id", "=", input.projectId)
    .where("id", "=", input.linkId)
    .where("revoked_at", "is", null)
    .returning("revoked_at")
    .executeTakeFirst();
  if (!row) {
    const exists = await db
      .selectFrom("share_links")
      .select("id")
      .where("project_id", "=", input.projectId)
      .where("id", "=", input.linkId)
      .executeTakeFirst();
    if (!exists) throw new AppError("NOT_FOUND", "No such link on this project.");
    throw new AppError("CONFLICT", "This link was already revoked.");
  }
  await recordAudit(db, {
    action: "share.revoke",
    outcome: "success",
    actorUserId: input.by.id,
    projectId: input.projectId,
    target: `share:${input.linkId}`,
  });
  return { revokedAt: new Date(row.revoked_at!) };
}
