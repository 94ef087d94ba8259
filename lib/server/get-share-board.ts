import "server-only";
import { sql, type Kysely } from "kysely";
import type { MomentOld } from "@/db/moment-old";
import type { Database } from "@/db/types";
import { projectTimeZone } from "@/lib/format/dates";
import { hashToken } from "@/lib/auth/tokens";
import { AppError } from "@/lib/errors";
import { pourBoardStatus, type BoardStatus } from "@/lib/stressing/pour-status";
import { readAttachment } from "@/lib/storage";
import { recordAudit } from "./record-audit";

/**
 * What a read-only link shows: the project's pours with their state on the board and the signed
 * revisions of each stressing report. Nothing about the crew: the only names are the signers', as
 * the signed reports print them. A revoked or expired link is gone (410), a token that was never
 * issued is not found (404); every view is audited.
 */

export interface BoardPour {
  pourId: string;
  name: string;
  level: string | null;
  status: BoardStatus;
  held: number;
  tendons: number;
  complete: number;
  signed: { revision: number; signerName: string; signedAt: Date }[];
  /** The standing release as the engineer signed it (null when not released or signed before signatures). */
  release: { signerName: string; licence: string; signedAt: Date; contentSha256: string } | null;
}

async function resolveLink(db: Kysely<Database>, token: string, ip: string | null, action: string, now: Date) {
  const link = await db
    .selectFrom("share_links")
    .innerJoin("projects", "projects.id", "share_links.project_id")
    .select([
      "share_links.id",
      "share_links.project_id",
      "share_links.label",
      "share_links.expires_at",
      "share_links.revoked_at",
      "projects.code",
      "projects.name",
      "projects.address",
      "projects.time_zone",
    ])
    .where("share_links.token_sha256", "=", hashToken(token))
    .executeTakeFirst();
  const ended = !link || link.revoked_at !== null || new Date(link.expires_at) <= now;
  await recordAudit(db, {
    action,
    outcome: ended ? "denied" : "success",
    projectId: link?.project_id ?? null,
    target: link ? `share:${link.id}` : null,
    ip,
    detail: link
      ? { label: link.label, ...(ended ? { reason: link.revoked_at ? "revoked" : "expired" } : {}) }
      : { reason: "unknown" },
  });
  if (!link) throw new AppError("NOT_FOUND", "There is no read-only link at this address.");
  if (ended) throw new AppError("GONE", "This link has expired or was revoked. Ask the project team for a new one.");
  return link;
}

/**
 * Whether a token was ever issued (live, expired or revoked), for the page's 404 before it streams.
 * A token never issued is audited as a denied view, as `getShareBoard` would; the page audits the rest.
 */
export async function shareLinkIssued(
  db: Kysely<Database>,
  input: { token: string; ip?: string | null },
): Promise<boolean> {
  const row = await db
    .selectFrom("share_links")
    .select("id")
    .where("token_sha256", "=", hashToken(input.token))
    .executeTakeFirst();
  if (!row)
    await recordAudit(db, {
      action: "share.view",
      outcome: "denied",
      projectId: null,
      target: null,
      ip: input.ip ?? null,
      detail: { reason: "unknown" },
    });
  return row !== undefined;
}

/**
 * The link is checked on the primary (a link revoked a moment ago is refused at once, and the view's
 * audit row is a write); the board itself is a moment-old read, from the replica when there is one.
 */
export async function getShareBoard(
  db: Kysely<Database>,
  reads: MomentOld,
  input: { token: string; ip?: string | null; now?: Date },
): Promise<{
  /** The project's time zone, in which the board shows its moments, as the reports do. */
  project: { code: string; name: string; address: string | null; timeZone: string };
  label: string;
  expiresAt: Date;
  pours: BoardPour[];
}> {
  const link = await resolveLink(db, input.token, input.ip ?? null, "share.view", input.now ?? new Date());
  const projectId = link.project_id;
  const [pours, revisions] = await reads.read((db) =>
    Promise.all([
      db
        .selectFrom("pours")
        .innerJoin("pour_states", "pour_states.pour_id", "pours.id")
        .leftJoin("releases", "releases.id", "pour_states.release_id")
        .select([
          "pours.id",
          "pours.name",
          "pours.level",
          "releases.signer_name",
          "releases.licence",
          "releases.content_sha256",
          "releases.created_at as release_signed_at",
          (eb) =>
            eb
              .selectFrom("tendons")
              .select(sql<string>`count(*)`.as("n"))
              .whereRef("tendons.pour_id", "=", "pours.id")
              .as("tendons"),
          (eb) =>
            eb
              .selectFrom("tendons")
              .select(sql<string>`count(*)`.as("n"))
              .whereRef("tendons.pour_id", "=", "pours.id")
              .where((w) =>
                w.exists(w.selectFrom("records").select("records.id").whereRef("records.tendon_id", "=", "tendons.id")),
              )
              .as("started"),
          (eb) =>
            eb
              .selectFrom("tendons")
              .select(sql<string>`count(*)`.as("n"))
              .whereRef("tendons.pour_id", "=", "pours.id")
              .where(
                sql<boolean>`(select e.provisional = false from evaluations e where e.tendon_id = tendons.id order by e.created_at desc, e.id desc limit 1)`,
              )
              .as("complete"),
          (eb) =>
            eb
              .selectFrom("tendons")
              .select(sql<string>`count(*)`.as("n"))
              .whereRef("tendons.pour_id", "=", "pours.id")
              .where((w) =>
                w.exists(
                  w
                    .selectFrom("flags")
                    .select("flags.id")
                    .whereRef("flags.tendon_id", "=", "tendons.id")
                    .where("flags.status", "!=", "closed"),
                ),
              )
              .as("held"),
          // A standing release (one the engineer has not reopened), from the one definition of a pour's status.
          sql<boolean>`pour_states.status = 'released'`.as("released"),
        ])
        .where("pours.project_id", "=", projectId)
        .orderBy("pours.name")
        .execute(),
      db
        .selectFrom("report_revisions")
        .select(["pour_id", "revision", "signer_name", "signed_at"])
        .where("project_id", "=", projectId)
        .where("kind", "=", "pour_stressing")
        .orderBy("revision", "desc")
        .execute(),
    ]),
  );
  return {
    project: { code: link.code, name: link.name, address: link.address, timeZone: projectTimeZone(link) },
    label: link.label,
    expiresAt: new Date(link.expires_at),
    pours: pours.map((p) => {
      const counts = {
        released: Boolean(p.released),
        tendons: Number(p.tendons ?? 0),
        started: Number(p.started ?? 0),
        complete: Number(p.complete ?? 0),
        held: Number(p.held ?? 0),
      };
      const state = pourBoardStatus(counts);
      return {
        pourId: p.id,
        name: p.name,
        level: p.level,
        status: state.status,
        held: state.held,
        tendons: counts.tendons,
        complete: counts.complete,
        signed: revisions
          .filter((r) => r.pour_id === p.id)
          .map((r) => ({ revision: r.revision, signerName: r.signer_name, signedAt: new Date(r.signed_at) })),
        release:
          p.signer_name && p.licence && p.content_sha256 && p.release_signed_at
            ? {
                signerName: p.signer_name,
                licence: p.licence,
                signedAt: new Date(p.release_signed_at),
                contentSha256: p.content_sha256,
              }
            : null,
      };
    }),
  };
}

/** A signed report through a shared link: the frozen file, as signed. Audited. */
export async function readSharedReport(
  db: Kysely<Database>,
  input: { token: string; pourId: string; revision: number; ip?: string | null; now?: Date },
) {
  const link = await resolveLink(db, input.token, input.ip ?? null, "share.download", input.now ?? new Date());
  const row = await db
    .selectFrom("report_revisions")
    .select(["attachment_id", "file_sha256"])
    .where("project_id", "=", link.project_id)
    .where("pour_id", "=", input.pourId)
    .where("kind", "=", "pour_stressing")
    .where("revision", "=", input.revision)
    .executeTakeFirst();
  if (!row) throw new AppError("NOT_FOUND", "No such signed report on this project.");
  return readAttachment(db, { projectId: link.project_id, attachmentId: row.attachment_id });
}
