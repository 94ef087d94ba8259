import "server-only";
import type { Kysely } from "kysely";
import { sql, type RawBuilder } from "kysely";
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

/**
 * What the special inspector observed on a project on one calendar day of the project's time zone,
 * in SI as stored: per pour, the day's events of each kind of `DAY_EVENTS` (the stressings, the
 * flags raised, the dispositions recorded, the lift-off checks and the detensions made that day,
 * each from the pour's own report, so the numbers, calibrations, predictions, verdicts and
 * references are the stressing report's); the concrete results entered and the tails cut.
 * The remarks, the statement of conformance and what was witnessed are the inspector's: the ones
 * being signed when the caller gives them, else those of the day's last signed revision. The groups
 * a witness statement is asked for are the day's: per pour, the schedule's members of the tendons
 * stressed that day (the pour itself for tendons with no member). The open exceptions are the flags
 * of the day's work not closed when the report is read or signed: raised that day, raised by work
 * done that day (its stressing or lift-off check), or on a tendon stressed, lift-off checked or
 * detensioned that day by work done before the day's end (not a later stressing's or check's flag). The PDF and the CSV render this one object.
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

type Table = keyof Database & string;
type Column<T extends Table> = `${T}.${keyof Database[T] & string}`;

/**
 * A kind of event that puts a pour on the day's report: where the server keeps it (the table, the
 * column naming its pour, through a joined table when its rows name none, and the column of its
 * moment), and where the pour's own report holds it (`pick`, the day's events in the report's
 * order) with the moments each shows (for the report's `asOf`).
 */
interface DayEventKind<T extends Table, J extends Table, Item> {
  table: T;
  through?: { table: J; on: [NoInfer<Column<J>>, NoInfer<Column<T>>] };
  pour: NoInfer<Column<T> | Column<J>>;
  time: NoInfer<Column<T>>;
  pick: (report: PourReport, inDay: (instant: Date) => boolean) => Item[];
  moments: (item: Item) => Date[];
}
const eventKind = <T extends Table, Item, J extends Table = T>(kind: DayEventKind<T, J, Item>) => kind;

/**
 * The day's events per pour, once: the SQL that finds the pours something happened on that day
 * and the filter that picks each pour's events of the day from its report are both drawn from
 * this list, so a new kind of event is added here and nowhere else.
 */
const DAY_EVENTS = {
  /** The stressings recorded this day (by the tablet's time), in the pour report's order. */
  records: eventKind({
    table: "records",
    pour: "records.pour_id",
    time: "records.device_time",
    pick: (report, inDay) => report.records.filter((r) => inDay(r.deviceTime)),
    moments: (r) => [r.deviceTime, ...(r.evaluation ? [r.evaluation.at] : [])],
  }),
  /** The flags raised this day. */
  flagsRaised: eventKind({
    table: "flags",
    pour: "flags.pour_id",
    time: "flags.created_at",
    pick: (report, inDay) => report.flags.filter((f) => inDay(f.raisedAt)),
    moments: (f) => [f.raisedAt, ...(f.closedAt ? [f.closedAt] : [])],
  }),
  /** The engineer's dispositions recorded this day, each with its flag. */
  dispositions: eventKind({
    table: "dispositions",
    through: { table: "flags", on: ["flags.id", "dispositions.flag_id"] },
    pour: "flags.pour_id",
    time: "dispositions.created_at",
    pick: (report, inDay) =>
      report.flags.flatMap((flag) =>
        flag.dispositions.filter((d) => inDay(d.at)).map((disposition) => ({ flag, disposition })),
      ),
    moments: (d) => [d.disposition.at],
  }),
  /** The lift-off checks made this day, as the pour report lists them. */
  liftoffChecks: eventKind({
    table: "liftoff_checks",
    pour: "liftoff_checks.pour_id",
    time: "liftoff_checks.checked_at",
    pick: (report, inDay) => report.liftoffChecks.filter((l) => inDay(l.at)),
    moments: (l) => [l.at],
  }),
  /** The detensions made this day, as the pour report lists them. */
  detensions: eventKind({
    table: "detensions",
    pour: "detensions.pour_id",
    time: "detensions.detensioned_at",
    pick: (report, inDay) => report.detensions.filter((d) => inDay(d.at)),
    moments: (d) => [d.at],
  }),
};
type DayEventKinds = typeof DAY_EVENTS;
type EventKey = keyof DayEventKinds;
const EVENT_KEYS = Object.keys(DAY_EVENTS) as EventKey[];

/** A pour's events of one day, kind by kind (the keys of the list above). */
export type DayEvents = { [K in EventKey]: ReturnType<DayEventKinds[K]["pick"]> };

export type DailyPour = DayEvents & {
  /** The pour's whole stressing report: its references, basis and equipment. */
  report: PourReport;
};

/** Whether something of a kind happened on the pour (`pours.id`) between the instants, in SQL. */
function happenedWithin(
  kind: DayEventKinds[EventKey],
  projectId: string,
  { start, end }: { start: Date; end: Date },
): RawBuilder<boolean> {
  const joined = kind.through
    ? sql` join ${sql.table(kind.through.table)} on ${sql.ref(kind.through.on[0])} = ${sql.ref(kind.through.on[1])}`
    : sql``;
  const time = sql.ref(kind.time);
  return sql<boolean>`exists (select 1 from ${sql.table(kind.table)}${joined} where ${sql.ref(kind.pour)} = ${sql.ref("pours.id")} and ${sql.ref(`${kind.table}.project_id`)} = ${projectId} and ${time} >= ${start} and ${time} < ${end})`;
}

/** A pour's events of the day, picked from its report kind by kind. */
export function dayEventsOf(report: PourReport, inDay: (instant: Date) => boolean): DayEvents {
  return Object.fromEntries(EVENT_KEYS.map((key) => [key, DAY_EVENTS[key].pick(report, inDay)])) as DayEvents;
}

const anyEvent = (events: DayEvents) => EVENT_KEYS.some((key) => events[key].length > 0);

/** Every moment the events show, kind by kind. */
function eventMoments(events: DayEvents): Date[] {
  return EVENT_KEYS.flatMap((key) =>
    (events[key] as unknown[]).flatMap(DAY_EVENTS[key].moments as (item: unknown) => Date[]),
  );
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
    // The pours something happened on that day, of any kind of the day's events.
    db
      .selectFrom("pours")
      .select(["pours.id", "pours.name"])
      .where("pours.project_id", "=", input.projectId)
      .where((eb) => eb.or(EVENT_KEYS.map((key) => happenedWithin(DAY_EVENTS[key], input.projectId, { start, end }))))
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
  const pours: DailyPour[] = reports.map((report) => ({ report, ...dayEventsOf(report, inDay) })).filter(anyEvent);

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
    const worked = new Set([...p.records, ...p.liftoffChecks, ...p.detensions].map((e) => e.tendonId));
    const dayTags = new Set(p.report.tendons.filter((t) => worked.has(t.tendonId)).map((t) => t.tag));
    // When the work that raised each flag was done: its stressing (a flag whose record is no longer
    // the standing revision came from a stressing before), the lift-off check that raised it, else
    // the moment it was raised.
    const stressedAt = new Map(p.report.records.map((r) => [r.recordId, r.deviceTime]));
    const checkedAt = new Map(p.report.liftoffChecks.map((l) => [l.raisedFlagReference, l.at]));
    const doneAt = (f: ReportFlag) =>
      f.recordId ? (stressedAt.get(f.recordId) ?? start) : (checkedAt.get(f.reference) ?? f.raisedAt);
    return p.report.flags
      .filter(
        (f) =>
          f.status !== "closed" &&
          (inDay(f.raisedAt) || inDay(doneAt(f)) || (dayTags.has(f.tendonTag) && doneAt(f) < end)),
      )
      .map((f) => ({
        reference: f.reference,
        pourName: p.report.pour.name,
        tendonTag: f.tendonTag,
        kind: f.kind,
        status: f.status,
      }));
  });

  const moments = [
    ...pours.flatMap(eventMoments),
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
