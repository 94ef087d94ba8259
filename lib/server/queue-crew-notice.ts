import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import type { Decision } from "@/lib/schemas/domain";
import { env } from "@/lib/env";
import { formatDateTime, projectTimeZone } from "@/lib/format/dates";
import { releaseMail, workOrderMail } from "@/lib/mail/templates";
import { DECISION_LABELS } from "@/lib/schemas/review";
import { qualified } from "@/lib/schemas/columns";
import { DISPOSITION_COLUMNS, dispositionFromRow } from "@/lib/schemas/disposition";
import { showLength, showPct, showPressure, type StoredResolution } from "@/lib/format/quantities";
import { queueMail } from "./queue-mail";

/** Dispositions that send the crew back to the tendon. */
export const ORDERS_WORK: readonly Decision[] = ["restress", "detension_restress", "liftoff_check", "replace"];

export type CrewNotice = { kind: "disposition"; dispositionId: string } | { kind: "release"; releaseId: string };

/**
 * Puts an e-mail to the project's crew and inspectors in the notifications outbox (sent by the
 * dispatcher), inside the caller's transaction: one for each disposition that orders field work,
 * one for each release. Figures are in the project's units. Nothing is queued when the
 * disposition orders no work or the project has nobody active in those roles.
 * Answers whether a message was queued.
 */
export async function queueCrewNotice(
  db: Kysely<Database>,
  input: { projectId: string; notice: CrewNotice },
): Promise<boolean> {
  const [project, people] = await Promise.all([
    db.selectFrom("projects").selectAll().where("id", "=", input.projectId).executeTakeFirstOrThrow(),
    db
      .selectFrom("project_members")
      .innerJoin("users", "users.id", "project_members.user_id")
      .select("users.email")
      .distinct()
      .where("project_members.project_id", "=", input.projectId)
      .where("project_members.role", "in", ["crew", "inspector"])
      .where("users.is_active", "=", true)
      .orderBy("users.email")
      .execute(),
  ]);
  const to = people.map((p) => p.email);
  if (!to.length) return false;
  const units = { unitSystem: project.unit_system, readingResolution: project.reading_resolution as StoredResolution };
  const notice = input.notice;

  if (notice.kind === "disposition") {
    const row = await db
      .selectFrom("dispositions")
      .innerJoin("flags", "flags.id", "dispositions.flag_id")
      .innerJoin("tendons", "tendons.id", "dispositions.tendon_id")
      .innerJoin("pours", "pours.id", "tendons.pour_id")
      .select([
        ...qualified("dispositions", DISPOSITION_COLUMNS),
        "flags.kind",
        "tendons.tag",
        "pours.id as pourId",
        "pours.name as pourName",
      ])
      .where("dispositions.project_id", "=", input.projectId)
      .where("dispositions.id", "=", notice.dispositionId)
      .executeTakeFirstOrThrow();
    const d = {
      ...dispositionFromRow(row),
      flagKind: row.kind,
      tag: row.tag,
      pourId: row.pourId,
      pourName: row.pourName,
    };
    if (!ORDERS_WORK.includes(d.decision)) return false;
    const [record, evaluation] = await Promise.all([
      db
        .selectFrom("records")
        .select(["tendon_end", "final_pressure_mpa", "measured_mm"])
        .where("project_id", "=", input.projectId)
        .where("tendon_id", "=", d.tendonId)
        .orderBy("received_at", "desc")
        .limit(1)
        .executeTakeFirst(),
      db
        .selectFrom("evaluations")
        .select(["verdict", "deviation_pct"])
        .where("project_id", "=", input.projectId)
        .where("tendon_id", "=", d.tendonId)
        .orderBy("created_at", "desc")
        .limit(1)
        .executeTakeFirst(),
    ]);
    const lastStressing = record
      ? [
          `end ${record.tendon_end}, gauge ${showPressure(units, record.final_pressure_mpa)}, elongation ${showLength(units, record.measured_mm)}`,
          evaluation
            ? `${evaluation.verdict}${evaluation.deviation_pct === null ? "" : ` ${showPct(evaluation.deviation_pct)}`}`
            : null,
        ]
          .filter(Boolean)
          .join(", ")
      : null;
    const mail = workOrderMail({
      to,
      projectName: project.name,
      pourName: d.pourName,
      tendonTag: d.tag,
      decisionLabel: DECISION_LABELS[d.decision],
      engineerName: d.engineerName,
      instructions: d.reasons,
      flagKind: d.flagKind,
      lastStressing,
      url: `${env.APP_URL}/field/pour?id=${d.pourId}&tendon=${d.tendonId}`,
    });
    await queueMail(db, {
      projectId: input.projectId,
      flagId: d.flagId,
      dedupeKey: `disposition:${d.id}`,
      to,
      mail,
    });
    return true;
  }

  const r = await db
    .selectFrom("releases")
    .innerJoin("pours", "pours.id", "releases.pour_id")
    .select([
      "releases.id",
      "releases.released_by_name",
      "releases.statement",
      "releases.created_at",
      "pours.id as pourId",
      "pours.name as pourName",
      (eb) =>
        eb
          .selectFrom("tendons")
          .select((e) => e.fn.countAll<string>().as("n"))
          .whereRef("tendons.pour_id", "=", "pours.id")
          .as("tendons"),
    ])
    .where("releases.project_id", "=", input.projectId)
    .where("releases.id", "=", notice.releaseId)
    .executeTakeFirstOrThrow();
  const mail = releaseMail({
    to,
    projectName: project.name,
    pourName: r.pourName,
    releasedBy: r.released_by_name,
    releasedAt: formatDateTime(r.created_at, projectTimeZone(project)),
    tendons: Number(r.tendons ?? 0),
    statement: r.statement,
    url: `${env.APP_URL}/field/pour?id=${r.pourId}`,
  });
  await queueMail(db, { projectId: input.projectId, flagId: null, dedupeKey: `release:${r.id}`, to, mail });
  return true;
}
