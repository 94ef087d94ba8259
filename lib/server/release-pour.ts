import "server-only";
import { isDeepStrictEqual } from "node:util";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import type { Role } from "@/lib/schemas/domain";
import { AppError } from "@/lib/errors";
import { stressedEnds } from "@/lib/stressing/basis";
import { inTransaction } from "./in-transaction";
import { queueCrewNotice } from "./queue-crew-notice";
import { touchReleasedPour } from "./touch-released-pour";
import { getPourReport } from "./get-pour-report";
import { reportContentSha256 } from "./sign-pour-report";

export interface ReleaseBlockers {
  /** A pour without a tendon schedule has nothing to release. */
  noSchedule: boolean;
  openFlags: { tendonTag: string; kind: string }[];
  unstressed: { tendonTag: string; missingEnds: string[] }[];
}

/** What stands between a pour and its release: open flags, and tendon ends with no record. */
export async function findReleaseBlockers(
  db: Kysely<Database>,
  input: { projectId: string; pourId: string },
): Promise<ReleaseBlockers> {
  const [openFlags, tendons, ends] = await Promise.all([
    db
      .selectFrom("flags")
      .innerJoin("tendons", "tendons.id", "flags.tendon_id")
      .select(["tendons.tag as tendonTag", "flags.kind"])
      .where("flags.project_id", "=", input.projectId)
      .where("flags.pour_id", "=", input.pourId)
      .where("flags.status", "!=", "closed")
      .orderBy("tendons.tag")
      .execute(),
    db
      .selectFrom("tendons")
      .select(["id", "tag", "ends"])
      .where("project_id", "=", input.projectId)
      .where("pour_id", "=", input.pourId)
      .orderBy("tag")
      .execute(),
    db
      .selectFrom("records")
      .select(["tendon_id", "tendon_end"])
      .distinct()
      .where("project_id", "=", input.projectId)
      .where("pour_id", "=", input.pourId)
      .execute(),
  ]);
  const unstressed = tendons
    .map((t) => ({
      tendonTag: t.tag,
      missingEnds: stressedEnds(t.ends).filter((e) => !ends.some((r) => r.tendon_id === t.id && r.tendon_end === e)),
    }))
    .filter((t) => t.missingEnds.length > 0);
  return { noSchedule: tendons.length === 0, openFlags, unstressed };
}

export interface ReleaseHooks {
  /** Called after the report was drawn outside the lock, before the lock is taken (tests let a write in here). */
  afterDraw?: () => void | Promise<void>;
}

/**
 * Refuses a release that may not happen: no such pour, the wrong role, already released, or
 * blockers left. With `lock`, the pour's row is held until the caller's transaction ends.
 */
async function refuseUnlessReleasable(
  db: Kysely<Database>,
  input: { projectId: string; pourId: string; by: { role: Role } },
  lock: boolean,
): Promise<void> {
  const pour = await db
    .selectFrom("pours")
    .innerJoin("projects", "projects.id", "pours.project_id")
    .select(["pours.id", "projects.release_by"])
    .where("pours.project_id", "=", input.projectId)
    .where("pours.id", "=", input.pourId)
    .$if(lock, (qb) => qb.forUpdate("pours"))
    .executeTakeFirst();
  if (!pour) throw new AppError("NOT_FOUND", "No such pour on this project.");
  if (input.by.role !== pour.release_by) {
    throw new AppError(
      "FORBIDDEN",
      `On this project the ${pour.release_by === "engineer" ? "engineer of record" : "inspector"} releases pours.`,
    );
  }
  const state = await db
    .selectFrom("pour_states")
    .select("release_id")
    .where("project_id", "=", input.projectId)
    .where("pour_id", "=", input.pourId)
    .executeTakeFirstOrThrow();
  if (state.release_id) throw new AppError("CONFLICT", "This pour is already released.");
  const blockers = await findReleaseBlockers(db, input);
  if (blockers.noSchedule)
    throw new AppError("CONFLICT", "The pour has no tendon schedule, so there is nothing to release.");
  if (blockers.openFlags.length || blockers.unstressed.length) {
    const parts = [
      blockers.openFlags.length
        ? `${blockers.openFlags.length} open flag(s) on ${[...new Set(blockers.openFlags.map((f) => f.tendonTag))].join(", ")}`
        : "",
      blockers.unstressed.length
        ? `${blockers.unstressed.length} tendon(s) with ends not recorded, such as ${blockers.unstressed
            .slice(0, 5)
            .map((t) => t.tendonTag)
            .join(", ")}`
        : "",
    ].filter(Boolean);
    throw new AppError("CONFLICT", `The pour cannot be released yet: ${parts.join("; ")}.`);
  }
}

/**
 * Releases a pour for tail cutting or grouting: only with no open flag and every scheduled end
 * recorded, by the role the project names (the engineer of record unless it says inspector).
 * The release is signed: the typed name, the licence number, the statement, the time (the row's
 * `created_at`) and the sha256 of the pour's stressing report as it stood at signing, the same
 * content hash the report's own signature covers.
 *
 * Drawing the report (seconds for a big pour) happens before the pour's row lock, so pushes to the
 * pour are not held behind it. Under the lock the report's content is read again (queries only) and
 * compared with what was drawn: the same, and the drawn hash stands; anything the report shows
 * changed meanwhile (a record, a flag, a tendon, the pour), and it is drawn again under the lock,
 * so the hash always covers the content as it stood at the release.
 */
export async function releasePour(
  db: Kysely<Database>,
  input: {
    projectId: string;
    pourId: string;
    by: { id: string; name: string; role: Role };
    statement: string;
    signerName: string;
    licence: string;
    hooks?: ReleaseHooks;
  },
): Promise<{ releaseId: string; contentSha256: string; signedAt: Date; redrawn: boolean }> {
  // The cheap refusals first, so a release that cannot happen draws nothing.
  await refuseUnlessReleasable(db, input, false);
  const drawn = await getPourReport(db, input);
  const drawnSha256 = await reportContentSha256(drawn);
  await input.hooks?.afterDraw?.();
  return inTransaction(db, async (trx) => {
    await refuseUnlessReleasable(trx, input, true);
    // Read under the pour's lock: no record or tendon can change the report between this read and the release.
    const current = await getPourReport(trx, input);
    const redrawn = !isDeepStrictEqual(current, drawn);
    const contentSha256 = redrawn ? await reportContentSha256(current) : drawnSha256;
    const row = await trx
      .insertInto("releases")
      .values({
        project_id: input.projectId,
        pour_id: input.pourId,
        released_by: input.by.id,
        released_by_name: input.by.name,
        statement: input.statement,
        signer_name: input.signerName,
        licence: input.licence,
        content_sha256: contentSha256,
      })
      .returning(["id", "created_at"])
      .executeTakeFirstOrThrow();
    await touchReleasedPour(trx, {
      projectId: input.projectId,
      pourId: input.pourId,
      byUserId: input.by.id,
      action: "pour.release",
      detail: { contentSha256, redrawnUnderLock: redrawn },
    });
    await queueCrewNotice(trx, { projectId: input.projectId, notice: { kind: "release", releaseId: row.id } });
    return { releaseId: row.id, contentSha256, signedAt: new Date(row.created_at), redrawn };
  });
}
