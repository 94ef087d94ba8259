import "server-only";
import type { Kysely } from "kysely";
import { sql } from "kysely";
import type { Database } from "@/db/types";
import { ENGINE_VERSION } from "@/lib/elongation";
import { AppError } from "@/lib/errors";
import { dayBounds, projectTimeZone } from "@/lib/format/dates";
import { onReportDay, remarksOfSnapshot } from "@/lib/reports/daily-rows";
import type { DailyAttestation } from "@/lib/schemas/daily-report";
import type { ReportSnapshot } from "@/lib/reports/report-changes";
import {
  getPourReport,
  reportProjectHead,
  type PourReport,
  type ReportConcreteResult,
  type ReportFlag,
} from "./get-pour-report";
import { selectConcreteResults } from "./list-concrete-results";
import type { PourRecord } from "./list-pour-records";

/**
 * What the special inspector observed on a project on one calendar day of the project's time zone,
 * in SI as stored: every stressing recorded that day by pour (from the pour's own report, so the
 * stressing numbers, calibrations, predictions and verdicts are the stressing report's), the flags
 * raised and the dispositions recorded that day, the concrete results entered and the tails cut.
 * The remarks, the statement of conformance and what was witnessed are the inspector's: the ones
 * being signed when the caller gives them, else those of the day's last signed revision. The groups
 * a witness statement is asked for are the day's: per pour, the schedule's members of the tendons
 * stressed that day (the pour itself for tendons with no member). The open exceptions are the flags
 * of the day's work (raised that day, or on a tendon stressed that day) not closed. The PDF and the
 * CSV render this one object.
 */

/** A pour's group of tendons stressed on the day, which the inspector states was witnessed or not. */
export interface WitnessGroup {
  pourId: string;
  pourName: string;
  /** The schedule's member; "" for the pour's tendons with no member named. */
  group: string;
  /** The tags stressed that day, in the pour report's order. */
  tags: string[];
  stressings: number;
}

export interface OpenException {
  reference: string;
  pourName: string;
  tendonTag: string;
  kind: ReportFlag["kind"];
  status: ReportFlag["status"];
}

export interface DailyPour {
  /** The pour's whole stressing report: its references, basis and equipment. */
  report: PourReport;
  /** The stressings recorded this day, in the pour report's order. */
  records: PourRecord[];
  flagsRaised: ReportFlag[];
  dispositions: { flag: ReportFlag; disposition: ReportFlag["dispositions"][number] }[];
}

export interface DailyReport {
  /** "2026-12-02", in the project's zone. */
  day: string;
  timeZone: string;
  /** The latest moment the report's content shows (the start of the day when it shows nothing). */
  asOf: Date;
  engineVersion: string;
  project: PourReport["project"];
  pours: DailyPour[];
  /** The concrete results entered that day, each as the pour's report gives it, with its pour. */
  concrete: (ReportConcreteResult & { pourName: string })[];
  tailCuts: { pourName: string; tag: string; cutBy: string; at: Date; heldReasons: string[] }[];
  remarks: string;
  witnessGroups: WitnessGroup[];
  openExceptions: OpenException[];
  /** What the inspector attests (being signed, else last signed); null before any such signature. */
  attestation: DailyAttestation | null;
}

export async function getDailyReport(
  db: Kysely<Database>,
  input: { projectId: string; day: string; remarks?: string; attestation?: DailyAttestation },
): Promise<DailyReport> {
  const project = await db.selectFrom("projects").selectAll().where("id", "=", input.projectId).executeTakeFirst();
  if (!project) throw new AppError("NOT_FOUND", "No such project.");
  const timeZone = projectTimeZone(project);
  const { start, end } = dayBounds(input.day, timeZone);
  const within = <T extends string>(column: T) =>
    sql<boolean>`${sql.ref(column)} >= ${start} and ${sql.ref(column)} < ${end}`;

  const [active, concrete, tailCuts, lastSigned] = await Promise.all([
    // The pours something happened on that day.
    db
      .selectFrom("pours")
      .select(["pours.id", "pours.name"])
      .where("pours.project_id", "=", input.projectId)
      .where((eb) =>
        eb.or([
          eb.exists(
            eb
              .selectFrom("records")
              .select(sql`1`.as("x"))
              .whereRef("records.pour_id", "=", "pours.id")
              .where("records.project_id", "=", input.projectId)
              .where(within("records.device_time")),
          ),
          eb.exists(
            eb
              .selectFrom("flags")
              .select(sql`1`.as("x"))
              .whereRef("flags.pour_id", "=", "pours.id")
              .where("flags.project_id", "=", input.projectId)
              .where(within("flags.created_at")),
          ),
          eb.exists(
            eb
              .selectFrom("dispositions")
              .innerJoin("flags", "flags.id", "dispositions.flag_id")
              .select(sql`1`.as("x"))
              .whereRef("flags.pour_id", "=", "pours.id")
              .where("dispositions.project_id", "=", input.projectId)
              .where(within("dispositions.created_at")),
          ),
        ]),
      )
      .orderBy("pours.name")
      .execute(),
    selectConcreteResults(db, input.projectId)
      .innerJoin("pours", "pours.id", "c.pour_id")
      .select(["pours.name as pourName", "users.name as enteredBy"])
      .where("pours.project_id", "=", input.projectId)
      .where(within("c.entered_at"))
      .orderBy("c.entered_at")
      .orderBy("c.id")
      .execute(),
    db
      .selectFrom("tail_cuts as t")
      .innerJoin("pours", "pours.id", "t.pour_id")
      .innerJoin("tendons", "tendons.id", "t.tendon_id")
      .innerJoin("users", "users.id", "t.cut_by")
      .select(["pours.name as pourName", "tendons.tag", "users.name as cutBy", "t.cut_at", "t.held_reasons"])
      .where("t.project_id", "=", input.projectId)
      .where("tendons.project_id", "=", input.projectId)
      .where(within("t.cut_at"))
      .orderBy("t.cut_at")
      .orderBy("tendons.tag")
      .execute(),
    input.remarks === undefined
      ? db
          .selectFrom("report_revisions")
          .select(["snapshot", "attestation"])
          .where("project_id", "=", input.projectId)
          .where("kind", "=", "daily_inspection")
          .where("report_day", "=", input.day)
          .orderBy("revision", "desc")
          .limit(1)
          .executeTakeFirst()
      : undefined,
  ]);

  // Each pour's report from the project row read above: one read of the project, not one per pour.
  const reports = await Promise.all(
    active.map((p) => getPourReport(db, { projectId: input.projectId, pourId: p.id }, { project })),
  );
  const inDay = (d: Date) => onReportDay(d, input.day, timeZone);
  const pours: DailyPour[] = reports
    .map((report) => ({
      report,
      records: report.records.filter((r) => inDay(r.deviceTime)),
      flagsRaised: report.flags.filter((f) => inDay(f.raisedAt)),
      dispositions: report.flags.flatMap((flag) =>
        flag.dispositions.filter((d) => inDay(d.at)).map((disposition) => ({ flag, disposition })),
      ),
    }))
    .filter((p) => p.records.length || p.flagsRaised.length || p.dispositions.length);

  // The members of the day's tendons, for the witness groups.
  const dayTendonIds = [...new Set(pours.flatMap((p) => p.records.map((r) => r.tendonId)))];
  const members = new Map(
    dayTendonIds.length
      ? (
          await db
            .selectFrom("tendons")
            .select(["id", "member"])
            .where("project_id", "=", input.projectId)
            .where("id", "in", dayTendonIds)
            .execute()
        ).map((t) => [t.id, t.member ?? ""])
      : [],
  );
  const witnessGroups: WitnessGroup[] = pours.flatMap((p) => {
    const groups = new Map<string, WitnessGroup>();
    for (const t of p.report.tendons) {
      const stressings = p.records.filter((r) => r.tendonId === t.tendonId).length;
      if (!stressings) continue;
      const group = members.get(t.tendonId) ?? "";
      const g = groups.get(group) ?? {
        pourId: p.report.pour.id,
        pourName: p.report.pour.name,
        group,
        tags: [],
        stressings: 0,
      };
      g.tags.push(t.tag);
      g.stressings += stressings;
      groups.set(group, g);
    }
    return [...groups.values()].sort((a, b) => a.group.localeCompare(b.group));
  });
  const openExceptions: OpenException[] = pours.flatMap((p) => {
    const dayTags = new Set(p.records.map((r) => r.tag));
    return p.report.flags
      .filter((f) => f.status !== "closed" && (inDay(f.raisedAt) || dayTags.has(f.tendonTag)))
      .map((f) => ({
        reference: f.reference,
        pourName: p.report.pour.name,
        tendonTag: f.tendonTag,
        kind: f.kind,
        status: f.status,
      }));
  });

  const moments = [
    ...pours.flatMap((p) => [
      ...p.records.flatMap((r) => [r.deviceTime, ...(r.evaluation ? [r.evaluation.at] : [])]),
      ...p.flagsRaised.flatMap((f) => [f.raisedAt, ...(f.closedAt ? [f.closedAt] : [])]),
      ...p.dispositions.map((d) => d.disposition.at),
    ]),
    ...concrete.map((c) => new Date(c.entered_at)),
    ...tailCuts.map((t) => new Date(t.cut_at)),
  ];
  const asOf = moments.length ? new Date(Math.max(...moments.map((m) => m.getTime()))) : start;

  return {
    day: input.day,
    timeZone,
    asOf,
    engineVersion: ENGINE_VERSION,
    project: reportProjectHead(project),
    pours,
    concrete: concrete.map((c) => ({
      pourName: c.pourName,
      specimen: c.specimen,
      strengthMPa: c.strength_mpa,
      ageDays: c.age_days,
      specimenCount: c.specimen_count,
      labReport: c.attachment_id ? (c.original_name ?? "uploaded (no file name)") : null,
      enteredBy: c.enteredBy,
      at: new Date(c.entered_at),
    })),
    tailCuts: tailCuts.map((t) => ({
      pourName: t.pourName,
      tag: t.tag,
      cutBy: t.cutBy,
      at: new Date(t.cut_at),
      heldReasons: t.held_reasons,
    })),
    remarks: input.remarks ?? remarksOfSnapshot(lastSigned?.snapshot as ReportSnapshot | undefined),
    witnessGroups,
    openExceptions,
    attestation: input.attestation ?? (lastSigned?.attestation as DailyAttestation | null | undefined) ?? null,
  };
}
