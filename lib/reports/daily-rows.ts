import { dayInZone, formatDateTime } from "@/lib/format/dates";
import { showLength, showPressure, showStrength } from "@/lib/format/quantities";
import { flagLabel } from "@/lib/schemas/flag";
import { type DailyAttestation, type WitnessEntry, WITNESS_WORDS } from "@/lib/schemas/daily-report";
import { DECISION_LABELS } from "@/lib/schemas/review";
import type { DailyPour, DailyReport, WitnessGroup } from "@/lib/server/get-daily-report";
import type { PourRecord } from "@/lib/server/list-pour-records";
import { RECORD_COLUMNS, recordRowsWithSources } from "./pour-rows";
import { concreteResultText } from "./concrete-lines";
import { addEntry, detensionEntry, liftoffEntry, type ReportSnapshot } from "./report-changes";
import { signatureLines, type SignatureState } from "./signature-lines";

/**
 * The daily special-inspection report's content as display strings in the project's units, once:
 * the PDF draws them and the CSV writes them. The stressing rows are the pour report's own rows
 * (lib/reports/pour-rows.ts) for the day's stressings, lift-off checks and detensions, with the
 * pour and the reading method added.
 * Pure.
 */

/** Whether an instant falls on a calendar day of the project's time zone (the day's grouping). */
export function onReportDay(instant: Date, day: string, timeZone: string): boolean {
  return dayInZone(instant, timeZone) === day;
}

/** The records of a list that belong to a day of the project's zone, in their order. */
export function recordsOnDay<T extends Pick<PourRecord, "deviceTime">>(records: T[], day: string, timeZone: string) {
  return records.filter((r) => onReportDay(r.deviceTime, day, timeZone));
}

export const DAILY_RECORD_COLUMNS = ["Pour", "Method", ...RECORD_COLUMNS] as const;
export type DailyRecordColumn = (typeof DAILY_RECORD_COLUMNS)[number];

const METHOD_WORDS = { marks: "marks on the strand", strokes: "jack strokes" } as const;

export const dailyTime = (report: Pick<DailyReport, "timeZone">, d: Date) => formatDateTime(d, report.timeZone);

const status = (s: string) => (s === "with_engineer" ? "with the engineer" : s);

/** A row of the day's records table: its cells, and the stressing it stands for (null for a lift-off check or a detension). */
export interface DailyRecordLine {
  cells: string[];
  record: PourRecord | null;
}

/**
 * A pour's rows of the day: the pour report's own rows (`recordRowsWithSources`) for the tendons
 * worked that day, with just the day's stressings, lift-off checks, detensions and flags, tendon by
 * tendon in the report's order; the pour and the reading method are added in front.
 */
function pourDayLines(p: DailyPour): DailyRecordLine[] {
  const worked = new Set([...p.records, ...p.liftoffChecks, ...p.detensions].map((e) => e.tendonId));
  const rows = recordRowsWithSources({
    ...p.report,
    tendons: p.report.tendons.filter((t) => worked.has(t.tendonId)),
    records: p.records,
    detensions: p.detensions,
    liftoffChecks: p.liftoffChecks,
    flags: p.flagsRaised,
  });
  return rows.map(({ cells, source }) => {
    const record = source.kind === "stressing" ? source.record : null;
    return { cells: [p.report.pour.name, record ? METHOD_WORDS[record.method] : "", ...cells], record };
  });
}

/** Every row of the day's records table, pour by pour, each with its stressing (the screen draws a verdict from it). */
export function dailyRecordLines(report: DailyReport): DailyRecordLine[] {
  return report.pours.flatMap(pourDayLines);
}

/** One row per stressing, lift-off check and detension of the day, pour by pour, in the pour report's order. */
export function dailyRecordRows(report: DailyReport): string[][] {
  return dailyRecordLines(report).map((line) => line.cells);
}

export function dailySummary(report: DailyReport): string {
  const records = report.pours.flatMap((p) => p.records);
  const verdictOf = (r: PourRecord) => r.evaluation?.verdict;
  const count = (v: string) => records.filter((r) => verdictOf(r) === v).length;
  const flags = report.pours.reduce((n, p) => n + p.flagsRaised.length, 0);
  const dispositions = report.pours.reduce((n, p) => n + p.dispositions.length, 0);
  const liftoffs = report.pours.flatMap((p) => p.liftoffChecks);
  const detensions = report.pours.reduce((n, p) => n + p.detensions.length, 0);
  const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;
  if (!report.pours.length && !report.concrete.length && !report.tailCuts.length)
    return `Nothing was recorded in Tautline on ${report.day}.`;
  const within = liftoffs.filter((l) => l.withinBand).length;
  return (
    `${plural(records.length, "stressing record")} on ${plural(report.pours.filter((p) => p.records.length).length, "pour")} ` +
    `(${count("in band")} in band, ${count("long")} long, ${count("short")} short, ` +
    `${records.length - count("in band") - count("long") - count("short")} incomplete or not evaluated); ` +
    `${records.filter((r) => r.stressing > 1).length} of them restresses. ` +
    `${plural(liftoffs.length, "lift-off check")}` +
    (liftoffs.length ? ` (${within} within the band, ${liftoffs.length - within} outside)` : "") +
    `, ${plural(detensions, "detension")}. ` +
    `${plural(flags, "flag")} raised, ${plural(dispositions, "disposition")} recorded, ` +
    `${plural(report.concrete.length, "concrete result")} entered, ${plural(report.tailCuts.length, "tendon")} with tails cut.`
  );
}

export function dailyFlagLines(report: DailyReport): { heading: string; lines: string[] }[] {
  return report.pours.flatMap((p) =>
    p.flagsRaised.map((f) => ({
      heading: `Flag ${f.reference} · ${p.report.pour.name} · ${f.tendonTag} · ${flagLabel(f.kind)} · ${status(f.status)}`,
      lines: [
        f.reason,
        `Raised ${dailyTime(report, f.raisedAt)}.`,
        ...(f.closedAt
          ? [
              `Closed ${dailyTime(report, f.closedAt)}${f.closedBy ? ` by ${f.closedBy}` : ""}${f.closeReason ? `: ${f.closeReason}` : "."}`,
            ]
          : []),
      ],
    })),
  );
}

export function dailyDispositionLines(report: DailyReport): string[] {
  return report.pours.flatMap((p) =>
    p.dispositions.map(
      ({ flag, disposition: d }) =>
        `Disposition ${d.reference} on flag ${flag.reference} (${p.report.pour.name}, ${flag.tendonTag}): ` +
        `${DECISION_LABELS[d.decision]}, by ${d.engineerName} (${d.licenceStatement}), ${dailyTime(report, d.at)}: ${d.reasons}`,
    ),
  );
}

/**
 * The equipment sets the day's stressings, lift-off checks and detensions used, each with the
 * calibrations those stood on (a lift-off check names its calibration's dates; a detension none).
 */
export function dailyEquipmentLines(report: DailyReport): [string, string][] {
  const sets = new Map<string, { serials: string; calibrations: Map<string, string> }>();
  const setOf = (e: PourRecord["equipment"]) => {
    const set = sets.get(e.name) ?? {
      serials: `Jack ${e.jackSerial}, gauge ${e.gaugeSerial}, pump ${e.pumpSerial ?? "not recorded"}.`,
      calibrations: new Map<string, string>(),
    };
    sets.set(e.name, set);
    return set.calibrations;
  };
  const dated = (c: { calibratedOn: string; validUntil: string; laboratory: string | null }) =>
    `Calibrated ${c.calibratedOn}, valid until ${c.validUntil}${c.laboratory ? `, ${c.laboratory}` : ""}`;
  for (const p of report.pours)
    for (const r of p.records) {
      const c = r.calibration;
      // Keyed by the calibration's dates, so a lift-off check on the same calibration adds no line.
      setOf(r.equipment).set(
        c ? dated(c) : "none",
        c
          ? `${dated(c)}; ` +
              `${c.certificate ? `certificate ${c.certificate}` : "no certificate uploaded"}` +
              `${c.inForce ? `; in force on ${report.day}` : `; NOT IN FORCE on ${report.day}`}`
          : "No calibration on file for that day.",
      );
    }
  for (const p of report.pours) {
    for (const l of p.liftoffChecks) {
      const calibrations = setOf(l.equipment);
      const key = dated(l.calibration);
      if (!calibrations.has(key)) calibrations.set(key, `${key} (used for a lift-off check).`);
    }
    for (const d of p.detensions) setOf(d.equipment);
  }
  return [...sets.entries()]
    .sort(([a], [b]) => a.localeCompare(b))
    .map(([name, s]) => [name, [s.serials, ...s.calibrations.values()].join(" ")]);
}

export function dailyConcreteLines(report: DailyReport): string[] {
  return report.concrete.map((c) => `${c.pourName}: ${concreteResultText(report.project, report.timeZone, c)}`);
}

export function dailyTailCutLines(report: DailyReport): string[] {
  return report.tailCuts.map(
    (t) =>
      `${t.pourName}, ${t.tag}: tails cut by ${t.cutBy} ${dailyTime(report, t.at)}` +
      (t.heldReasons.length ? `; the tendon was held: ${t.heldReasons.join("; ")}` : ""),
  );
}

/** "S-01, member B3" or "S-01" (tendons with no member named): how a witness group is called. */
export function witnessGroupLabel(g: Pick<WitnessGroup, "pourName" | "group">): string {
  return g.group ? `${g.pourName}, member ${g.group}` : g.pourName;
}

const sameGroup = (g: Pick<WitnessGroup, "pourId" | "group">, w: Pick<WitnessEntry, "pourId" | "group">) =>
  g.pourId === w.pourId && g.group === w.group;

/** One line per group stressed that day: what was stressed and what the inspector states was witnessed. */
export function dailyWitnessLines(report: DailyReport): { label: string; stressed: string; stated: string }[] {
  return report.witnessGroups.map((g) => {
    const w = report.attestation?.witness.find((e) => sameGroup(g, e));
    const plural = g.stressings === 1 ? "stressing" : "stressings";
    return {
      label: witnessGroupLabel(g),
      stressed: `${g.tags.join(", ")} (${g.stressings} ${plural})`,
      stated: !w
        ? "not stated yet: the inspector states it when signing"
        : w.extent === "none"
          ? `${WITNESS_WORDS.none}: ${w.note}`
          : `${WITNESS_WORDS[w.extent]} by ${w.witnessedBy}${w.note ? `: ${w.note}` : ""}`,
    };
  });
}

/** A group as the signing form asks about it. */
export interface WitnessGroupView {
  pourId: string;
  /** The schedule's member; "" for the pour's tendons with no member named. */
  group: string;
  /** "S-01, member B3". */
  label: string;
  /** "U01, U02 (3 stressings)". */
  stressed: string;
}

export function witnessGroupViews(report: DailyReport): WitnessGroupView[] {
  const lines = dailyWitnessLines(report);
  return report.witnessGroups.map((g, i) => ({
    pourId: g.pourId,
    group: g.group,
    label: lines[i]!.label,
    stressed: lines[i]!.stressed,
  }));
}

/** The open exceptions in words: "flag F-0012 (S-01, U03): elongation out of band, open". */
export function openExceptionLines(report: Pick<DailyReport, "openExceptions">): string[] {
  return report.openExceptions.map(
    (f) => `flag ${f.reference} (${f.pourName}, ${f.tendonTag}): ${flagLabel(f.kind)}, ${status(f.status)}`,
  );
}

/**
 * The statement of conformance and, when the work was not in conformance, the open exceptions
 * (a screen lists them one per line; the PDF prints them in the sentence, `dailyConformanceLine`).
 */
export function dailyConformance(report: DailyReport): { statement: string; exceptions: string[] } {
  const a = report.attestation;
  if (!a)
    return {
      statement: "Not stated yet: the inspector states whether the work was in conformance when signing.",
      exceptions: [],
    };
  if (a.conformance === "conforming")
    return {
      statement: "The work inspected this day WAS IN CONFORMANCE with the approved construction documents.",
      exceptions: [],
    };
  const exceptions = openExceptionLines(report);
  return {
    statement:
      "The work inspected this day WAS NOT IN CONFORMANCE with the approved construction documents. " +
      (exceptions.length
        ? "Open exceptions:"
        : "No flag is open in Tautline; the inspector's remarks say what was not in conformance."),
    exceptions,
  };
}

/** The statement of conformance as it prints, with the open exceptions when the work was not in conformance. */
export function dailyConformanceLine(report: DailyReport): string {
  const { statement, exceptions } = dailyConformance(report);
  return exceptions.length ? `${statement} ${exceptions.join("; ")}.` : statement;
}

/**
 * What is wrong with what the inspector attests for this day, field by field (empty when nothing):
 * every group stressed that day stated once and no other; "in conformance" refused while an
 * exception of the day's work is open; "not in conformance" with no open flag needs the remarks to
 * say why.
 */
export function attestationProblems(
  report: Pick<DailyReport, "witnessGroups" | "openExceptions">,
  values: DailyAttestation & { remarks: string },
): Record<string, string[]> {
  const problems: Record<string, string[]> = {};
  values.witness.forEach((w, i) => {
    const matches = report.witnessGroups.some((g) => sameGroup(g, w));
    const earlier = values.witness.slice(0, i).some((e) => sameGroup(e, w));
    if (!matches)
      problems[`witness.${i}.group`] = ["No tendon of that pour or member was stressed this day; reload the day."];
    else if (earlier) problems[`witness.${i}.group`] = ["This group is stated twice; keep one statement."];
  });
  const missing = report.witnessGroups.filter((g) => !values.witness.some((w) => sameGroup(g, w)));
  if (missing.length) problems.witness = [`State what was witnessed for ${missing.map(witnessGroupLabel).join("; ")}.`];
  if (values.conformance === "conforming" && report.openExceptions.length)
    problems.conformance = [
      `Open exceptions remain (${report.openExceptions.map((f) => f.reference).join(", ")}): choose not in conformance, which lists them, or wait for the engineer's dispositions.`,
    ];
  if (values.conformance === "not_conforming" && !report.openExceptions.length && !values.remarks)
    problems.remarks = ["No flag is open: say in the remarks what was not in conformance."];
  return problems;
}

/** The remarks a signed snapshot holds (quoted there, "none" when there were none). */
export function remarksOfSnapshot(snapshot: ReportSnapshot | null | undefined): string {
  const stored = snapshot?.remarks;
  return stored && stored !== "none" ? stored.replace(/^"|"$/g, "") : "";
}

/** What a signed revision of the day's report covers, key by key (compared by describeChanges). */
export function dailySnapshot(report: DailyReport): ReportSnapshot {
  const p = report.project;
  const snapshot: ReportSnapshot = { remarks: report.remarks ? `"${report.remarks}"` : "none" };
  if (report.attestation)
    snapshot.conformance = report.attestation.conformance === "conforming" ? "in conformance" : "not in conformance";
  for (const w of dailyWitnessLines(report)) snapshot[`witness ${w.label}`] = w.stated;
  for (const pour of report.pours) {
    const name = pour.report.pour.name;
    for (const r of pour.records)
      snapshot[`record ${name} ${r.tag} end ${r.end} stressing ${r.stressing}`] =
        `revision ${r.revision}, ${showLength(p, r.measuredMm)} at ${showPressure(p, r.finalPressureMPa)}` +
        (r.evaluation ? `, ${r.evaluation.verdict}` : "");
    for (const l of pour.liftoffChecks) addEntry(snapshot, liftoffEntry(pour.report, l, name));
    for (const d of pour.detensions) addEntry(snapshot, detensionEntry(pour.report, d, name));
    for (const f of pour.flagsRaised) snapshot[`flag ${f.reference} (${name} ${f.tendonTag})`] = status(f.status);
    for (const { flag, disposition } of pour.dispositions)
      snapshot[`disposition ${disposition.reference} (${name} ${flag.tendonTag})`] = disposition.decision.replace(
        /_/g,
        " ",
      );
  }
  for (const c of report.concrete)
    snapshot[`concrete ${c.pourName} ${dailyTime(report, c.at)}`] =
      `${showStrength(p, c.strengthMPa)} at ${c.ageDays} days`;
  for (const t of report.tailCuts) snapshot[`tail cut ${t.pourName} ${t.tag}`] = dailyTime(report, t.at);
  return snapshot;
}

export const CSV_DAILY_COLUMNS = ["Project", "Day", "Section", ...DAILY_RECORD_COLUMNS, "Details"] as const;

/**
 * The CSV's rows: one per stressing, lift-off check and detension (section "stressing"), then one per flag, disposition, equipment
 * set, concrete result and tail cut with its words in Details, then what the inspector states was
 * witnessed of each group (section "witness"), the statement of conformance, the remarks and the
 * signature (section "signature": who signed this content and when, or that it is not signed).
 */
export function dailyCsvRows(report: DailyReport, signature: SignatureState): string[][] {
  const blank = DAILY_RECORD_COLUMNS.map(() => "");
  const head = (section: string) => [report.project.code, report.day, section];
  const other = (section: string, details: string) => [...head(section), ...blank, details];
  return [
    ...dailyRecordRows(report).map((row) => [...head("stressing"), ...row, ""]),
    ...dailyFlagLines(report).map((f) => other("flag", [f.heading, ...f.lines].join(" "))),
    ...dailyDispositionLines(report).map((d) => other("disposition", d)),
    ...dailyEquipmentLines(report).map(([name, text]) => other("equipment", `${name}: ${text}`)),
    ...dailyConcreteLines(report).map((c) => other("concrete", c)),
    ...dailyTailCutLines(report).map((t) => other("tail cut", t)),
    ...dailyWitnessLines(report).map((w) => other("witness", `${w.label}: ${w.stressed}; ${w.stated}`)),
    other("conformance", dailyConformanceLine(report)),
    other("remarks", report.remarks || "none"),
    ...signatureLines(signature, report.timeZone).map(([label, value]) => other("signature", `${label}: ${value}`)),
  ];
}

export function dailyFileName(report: DailyReport, extension: "pdf" | "csv", revision?: number): string {
  const suffix = revision ? `-rev${revision}` : "";
  return (
    `${report.project.code}-${report.day}-daily-inspection${suffix}`.replace(/[^A-Za-z0-9._-]+/g, "-") + `.${extension}`
  );
}
