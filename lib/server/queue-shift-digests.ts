import "server-only";
import type { Kysely, Transaction } from "kysely";
import type { Database } from "@/db/types";
import { env } from "@/lib/env";
import { projectTimeZone } from "@/lib/format/dates";
import { showLength, showPct, type StoredResolution } from "@/lib/format/quantities";
import { shiftDigestMail } from "@/lib/mail/templates";
import { FLAG_STATUS_LABELS, flagLabel } from "@/lib/schemas/flag";
import { needsAtOnce } from "@/lib/stressing/flag-mail";
import { lastEndedShift, shiftWords } from "@/lib/stressing/shift";
import { queueMail } from "./queue-mail";

/**
 * The shift digests: for each member who takes flags as a digest, once the project's shift has
 * ended (in the project's time zone), one e-mail listing every flag raised on the project since
 * the member's last digest, up to that shift end. The member's row is claimed FOR UPDATE SKIP
 * LOCKED and moved on (digest_from) in the same transaction that queues the e-mail, whose dedupe
 * key names the member and the shift end: two dispatchers never queue it twice, and a dispatcher
 * that dies before its commit leaves it for the next. A shift with no flag sends nothing.
 * `now` is the clock, injected by tests.
 */
export async function queueShiftDigests(db: Kysely<Database>, input: { now?: Date } = {}): Promise<number> {
  const now = input.now ?? new Date();
  const members = await db
    .selectFrom("project_members")
    .innerJoin("projects", "projects.id", "project_members.project_id")
    .innerJoin("users", "users.id", "project_members.user_id")
    .select([
      "project_members.project_id as projectId",
      "project_members.user_id as userId",
      "project_members.digest_from as digestFrom",
      "projects.time_zone",
      "projects.shift_end_minutes as shiftEnds",
    ])
    .where("project_members.flag_mail", "=", "digest")
    .where("users.is_active", "=", true)
    .execute();
  let queued = 0;
  for (const m of members) {
    const due = lastEndedShift(now, projectTimeZone(m), m.shiftEnds).end;
    if (!m.digestFrom || +m.digestFrom >= +due) continue;
    const sent = await db.transaction().execute(async (trx) => {
      const claimed = await trx
        .selectFrom("project_members")
        .select("digest_from")
        .where("project_id", "=", m.projectId)
        .where("user_id", "=", m.userId)
        .where("flag_mail", "=", "digest")
        .where("digest_from", "<", due)
        .forUpdate()
        .skipLocked()
        .executeTakeFirst();
      if (!claimed?.digest_from) return false;
      const mailed = await queueDigest(trx, {
        projectId: m.projectId,
        userId: m.userId,
        from: claimed.digest_from,
        through: due,
      });
      await trx
        .updateTable("project_members")
        .set({ digest_from: due })
        .where("project_id", "=", m.projectId)
        .where("user_id", "=", m.userId)
        .execute();
      return mailed;
    });
    if (sent) queued++;
  }
  return queued;
}

/**
 * Queues one member's digest of the flags raised on the project in (from, through], inside the
 * caller's transaction (which holds the member's row). Answers whether an e-mail was queued.
 */
export async function queueDigest(
  trx: Transaction<Database>,
  input: { projectId: string; userId: string; from: Date; through: Date },
): Promise<boolean> {
  const [project, user, flags] = await Promise.all([
    trx
      .selectFrom("projects")
      .select(["name", "unit_system", "reading_resolution", "time_zone"])
      .where("id", "=", input.projectId)
      .executeTakeFirstOrThrow(),
    trx.selectFrom("users").select("email").where("id", "=", input.userId).executeTakeFirstOrThrow(),
    trx
      .selectFrom("flags")
      .innerJoin("tendons", (j) =>
        j.onRef("tendons.id", "=", "flags.tendon_id").onRef("tendons.project_id", "=", "flags.project_id"),
      )
      .innerJoin("pours", "pours.id", "tendons.pour_id")
      .leftJoin("evaluations", (j) =>
        j.onRef("evaluations.id", "=", "flags.evaluation_id").onRef("evaluations.project_id", "=", "flags.project_id"),
      )
      .select([
        "flags.id",
        "flags.kind",
        "flags.reason",
        "flags.status",
        "flags.created_at",
        "tendons.tag",
        "pours.name as pourName",
        "evaluations.verdict",
        "evaluations.provisional",
        "evaluations.deviation_pct",
        "evaluations.measured_mm",
        "evaluations.predicted_mm",
      ])
      .where("flags.project_id", "=", input.projectId)
      .where("flags.created_at", ">", input.from)
      .where("flags.created_at", "<=", input.through)
      .orderBy("flags.created_at")
      .orderBy("flags.id")
      .execute(),
  ]);
  if (!flags.length) return false;
  const units = { unitSystem: project.unit_system, readingResolution: project.reading_resolution as StoredResolution };
  const timeZone = projectTimeZone(project);
  const lines = flags.map((f) => {
    const verdict =
      f.verdict && f.deviation_pct !== null
        ? `verdict ${f.verdict}${f.provisional ? " (provisional)" : ""} ${showPct(f.deviation_pct)}` +
          (f.measured_mm !== null && f.predicted_mm !== null
            ? `, measured ${showLength(units, f.measured_mm)} against ${showLength(units, f.predicted_mm)} predicted`
            : "")
        : f.verdict
          ? `verdict ${f.verdict}`
          : "no elongation verdict";
    return {
      line:
        `${f.pourName}, tendon ${f.tag}: ${flagLabel(f.kind)}; ${verdict}. ${f.reason} ` +
        `Flag ${FLAG_STATUS_LABELS[f.status].toLowerCase()}` +
        (needsAtOnce([f.kind]) ? "; also e-mailed when raised, as it needs action before the shift ends." : "."),
    };
  });
  const mail = shiftDigestMail({
    to: user.email,
    projectName: project.name,
    period: shiftWords({ start: input.from, end: input.through }, timeZone),
    flags: lines,
    url: `${env.APP_URL}/review`,
  });
  const queued = await queueMail(trx, {
    projectId: input.projectId,
    flagId: flags[0]!.id,
    dedupeKey: `digest:${input.projectId}:${input.userId}:${input.through.toISOString()}`,
    to: [user.email],
    mail,
  });
  return queued;
}
