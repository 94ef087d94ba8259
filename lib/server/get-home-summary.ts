import "server-only";
import { sql, type Kysely } from "kysely";
import type { Database } from "@/db/types";
import type { Role } from "@/lib/schemas/domain";
import { dayInZone } from "@/lib/format/dates";
import { findFlags, type FlaggedTendon } from "./find-flags";
import { findReleaseCandidates, type ReleaseCandidate } from "./find-release-candidates";

export interface PourToday {
  projectId: string;
  projectName: string;
  pourId: string;
  pourName: string;
  plannedOn: string | null;
  tendons: number;
  stressed: number;
}

export interface SetupGap {
  projectId: string;
  projectName: string;
  text: string;
  href: string;
}

/** What each role's home page shows, for the projects where the person holds that role. */
export async function getHomeSummary(
  db: Kysely<Database>,
  input: { memberships: { projectId: string; projectName: string; role: Role }[]; now?: Date },
) {
  const now = input.now ?? new Date();
  // Today at each project's site: the calendar date of `now` in the project's time zone.
  const siteToday = sql<string>`(${now.toISOString()}::timestamptz at time zone projects.time_zone)::date`;
  const ids = (role: Role) => input.memberships.filter((m) => m.role === role).map((m) => m.projectId);
  const crew = ids("crew");
  const inspector = ids("inspector");
  const engineer = ids("engineer");
  const admin = ids("admin");
  const watching = [...new Set([...crew, ...inspector])];

  const poursToday: PourToday[] = watching.length
    ? (
        await db
          .selectFrom("pours")
          .innerJoin("projects", "projects.id", "pours.project_id")
          .innerJoin("pour_states", "pour_states.pour_id", "pours.id")
          .select([
            "pours.project_id as projectId",
            "projects.name as projectName",
            "pours.id as pourId",
            "pours.name as pourName",
            "pours.planned_stressing_date as plannedOn",
            (eb) =>
              eb
                .selectFrom("tendons")
                .select((e) => e.fn.countAll<number>().as("n"))
                .whereRef("tendons.pour_id", "=", "pours.id")
                .as("tendons"),
            (eb) =>
              eb
                .selectFrom("records")
                .select(sql<number>`count(distinct records.tendon_id)`.as("n"))
                .whereRef("records.pour_id", "=", "pours.id")
                .as("stressed"),
          ])
          .where("pours.project_id", "in", watching)
          .where("pour_states.status", "!=", "released")
          .where((eb) =>
            eb.or([eb("pours.planned_stressing_date", "=", siteToday), eb("pour_states.status", "=", "stressing")]),
          )
          .orderBy("projects.name")
          .orderBy("pours.name")
          .execute()
      ).map((p) => ({ ...p, tendons: Number(p.tendons ?? 0), stressed: Number(p.stressed ?? 0) }))
    : [];

  const reviewing = [...new Set([...inspector, ...engineer])];
  const [openFlags, awaitingRelease] = await Promise.all([
    reviewing.length
      ? findFlags(db, { projectIds: reviewing, filter: { status: "any_open" } })
      : Promise.resolve([] as FlaggedTendon[]),
    engineer.length ? findReleaseCandidates(db, engineer) : Promise.resolve([] as ReleaseCandidate[]),
  ]);

  const gaps: SetupGap[] = [];
  if (admin.length) {
    const [noLot, expiring, emptyPours] = await Promise.all([
      db
        .selectFrom("tendons")
        .innerJoin("projects", "projects.id", "tendons.project_id")
        .select([
          "tendons.project_id as projectId",
          "projects.name as projectName",
          (eb) => eb.fn.countAll<number>().as("n"),
        ])
        .where("tendons.project_id", "in", admin)
        .where("tendons.strand_lot_id", "is", null)
        .groupBy(["tendons.project_id", "projects.name"])
        .execute(),
      db
        .selectFrom("calibrations")
        .innerJoin("equipment_sets", "equipment_sets.id", "calibrations.equipment_set_id")
        .innerJoin("projects", "projects.id", "calibrations.project_id")
        .select([
          "calibrations.project_id as projectId",
          "projects.name as projectName",
          "equipment_sets.name as setName",
          "calibrations.valid_until as validUntil",
          "projects.time_zone as timeZone",
        ])
        .where("calibrations.project_id", "in", admin)
        .where("calibrations.valid_until", "<=", sql<string>`${siteToday} + 14`)
        .where(({ not, exists, selectFrom }) =>
          not(
            exists(
              selectFrom("calibrations as newer")
                .select("newer.id")
                .whereRef("newer.equipment_set_id", "=", "calibrations.equipment_set_id")
                .whereRef("newer.valid_until", ">", "calibrations.valid_until"),
            ),
          ),
        )
        .orderBy("calibrations.valid_until")
        .execute(),
      db
        .selectFrom("pours")
        .innerJoin("projects", "projects.id", "pours.project_id")
        .select(["pours.project_id as projectId", "projects.name as projectName", "pours.name as pourName"])
        .where("pours.project_id", "in", admin)
        .where(({ not, exists, selectFrom }) =>
          not(exists(selectFrom("tendons").select("tendons.id").whereRef("tendons.pour_id", "=", "pours.id"))),
        )
        .execute(),
    ]);
    for (const g of noLot) {
      gaps.push({
        projectId: g.projectId,
        projectName: g.projectName,
        text: `${g.n} tendons have no strand lot: they are computed with nominal strand values.`,
        href: `/projects/${g.projectId}/setup`,
      });
    }
    for (const c of expiring) {
      const expired = c.validUntil < dayInZone(now, c.timeZone);
      gaps.push({
        projectId: c.projectId,
        projectName: c.projectName,
        text: `${c.setName}: calibration ${expired ? "expired" : "runs out"} on ${c.validUntil}.`,
        href: `/projects/${c.projectId}/equipment`,
      });
    }
    for (const p of emptyPours) {
      gaps.push({
        projectId: p.projectId,
        projectName: p.projectName,
        text: `${p.pourName} has no tendon schedule yet.`,
        href: `/projects/${p.projectId}/setup`,
      });
    }
  }

  return {
    poursToday,
    openFlags,
    waitingDisposition: openFlags.filter((t) => engineer.includes(t.projectId)),
    awaitingRelease: awaitingRelease.filter((p) => !p.releasedBy),
    gaps,
  };
}
