import "server-only";
import type { Kysely } from "kysely";
import type { Database } from "@/db/types";
import { env } from "@/lib/env";
import { dayInZone, projectTimeZone } from "@/lib/format/dates";
import { gaugeCheckMail } from "@/lib/mail/templates";
import { gaugeCheckFigures, gaugeChecks } from "@/lib/stressing/gauge-check";
import { judgedTendon } from "./get-pour-insight";
import { listTendonResults } from "./list-tendon-results";
import { queueMail } from "./queue-mail";

/** Evaluations older than this are not looked at again (a pour idle for two days has been scanned). */
const LOOK_BACK_MS = 2 * 24 * 3_600_000;

/**
 * The inspector's drift e-mail: for each pour with evaluations not yet looked at, the same gauge
 * check the tablet and the insight page make (lib/stressing/gauge-check.ts); for each set it marks,
 * one e-mail to the project's active inspectors per set, per pour, per day in the project's zone
 * (the dedupe key names all three, so a later evaluation the same day sends nothing new). The
 * pour's scan row is claimed FOR UPDATE SKIP LOCKED, so two dispatchers do not scan it together.
 * `now` is the clock, injected by tests. Answers how many e-mails were queued.
 */
export async function queueGaugeChecks(db: Kysely<Database>, input: { now?: Date } = {}): Promise<number> {
  const now = input.now ?? new Date();
  const pours = await db
    .selectFrom("evaluations")
    .innerJoin("tendons", (j) =>
      j.onRef("tendons.id", "=", "evaluations.tendon_id").onRef("tendons.project_id", "=", "evaluations.project_id"),
    )
    .leftJoin("gauge_drift_scans", "gauge_drift_scans.pour_id", "tendons.pour_id")
    .select((eb) => [
      "tendons.project_id as projectId",
      "tendons.pour_id as pourId",
      eb.fn.max("evaluations.created_at").as("latest"),
    ])
    .where("evaluations.created_at", ">", new Date(+now - LOOK_BACK_MS))
    .where("evaluations.created_at", "<=", now)
    .where((eb) =>
      eb.or([
        eb("gauge_drift_scans.scanned_through", "is", null),
        eb("evaluations.created_at", ">", eb.ref("gauge_drift_scans.scanned_through")),
      ]),
    )
    .groupBy(["tendons.project_id", "tendons.pour_id"])
    .execute();

  let queued = 0;
  for (const p of pours) {
    const latest = new Date(p.latest);
    queued += await db.transaction().execute(async (trx) => {
      await trx
        .insertInto("gauge_drift_scans")
        .values({ pour_id: p.pourId, project_id: p.projectId, scanned_through: new Date(0) })
        .onConflict((oc) => oc.column("pour_id").doNothing())
        .execute();
      const scan = await trx
        .selectFrom("gauge_drift_scans")
        .select("scanned_through")
        .where("pour_id", "=", p.pourId)
        .where("project_id", "=", p.projectId)
        .forUpdate()
        .skipLocked()
        .executeTakeFirst();
      if (!scan || +scan.scanned_through >= +latest) return 0;
      const sent = await mailChecks(trx, { projectId: p.projectId, pourId: p.pourId, now });
      await trx
        .updateTable("gauge_drift_scans")
        .set({ scanned_through: latest })
        .where("pour_id", "=", p.pourId)
        .execute();
      return sent;
    });
  }
  return queued;
}

async function mailChecks(
  db: Kysely<Database>,
  input: { projectId: string; pourId: string; now: Date },
): Promise<number> {
  const results = await listTendonResults(db, { projectId: input.projectId, pourId: input.pourId });
  const checks = gaugeChecks(results.filter((t) => t.pourId === input.pourId).map(judgedTendon));
  if (!checks.length) return 0;
  const [project, pour, inspectors] = await Promise.all([
    db.selectFrom("projects").select(["name", "time_zone"]).where("id", "=", input.projectId).executeTakeFirstOrThrow(),
    db
      .selectFrom("pours")
      .select("name")
      .where("project_id", "=", input.projectId)
      .where("id", "=", input.pourId)
      .executeTakeFirstOrThrow(),
    db
      .selectFrom("project_members")
      .innerJoin("users", "users.id", "project_members.user_id")
      .select("users.email")
      .where("project_members.project_id", "=", input.projectId)
      .where("project_members.role", "=", "inspector")
      .where("users.is_active", "=", true)
      .orderBy("users.email")
      .execute(),
  ]);
  if (!inspectors.length) return 0;
  const day = dayInZone(input.now, projectTimeZone(project));
  let sent = 0;
  for (const check of checks) {
    const mail = gaugeCheckMail({
      to: inspectors.map((i) => i.email),
      projectName: project.name,
      pourName: pour.name,
      setName: check.setName,
      figures: gaugeCheckFigures(check),
      note: check.note,
      url: `${env.APP_URL}/projects/${input.projectId}/pours/${input.pourId}/insight`,
    });
    const queued = await queueMail(db, {
      projectId: input.projectId,
      flagId: null,
      dedupeKey: `gauge:${input.pourId}:${check.setId}:${day}`,
      to: inspectors.map((i) => i.email),
      mail,
    });
    if (queued) sent++;
  }
  return sent;
}
