import { formatDateTime } from "@/lib/format/dates";
import { showForce, showLength, showPct, showPressure } from "@/lib/format/quantities";
import type { PourReport, ReportDetension, ReportLiftoff } from "@/lib/server/get-pour-report";
import { concreteResultText } from "./concrete-lines";
import { concreteLine } from "./pour-rows";

/**
 * What a signed revision says changed since the previous one. A snapshot names each thing a reader
 * signs for (each stressing of each end, each lift-off check and detension, each flag, each
 * disposition, the release, the concrete, the pour's status) with a short text of its state; two snapshots compare key by key. Pure.
 */

export type ReportSnapshot = Record<string, string>;

export function pourSnapshot(report: PourReport): ReportSnapshot {
  const p = report.project;
  const snapshot: ReportSnapshot = {
    "pour status": report.pour.status,
    concrete: concreteLine(report),
    release: report.release ? `released by ${report.release.byName}` : "not released",
  };
  for (const r of report.records) {
    snapshot[`record ${r.tag} end ${r.end} stressing ${r.stressing}`] =
      `revision ${r.revision}, ${showLength(p, r.measuredMm)} at ${showPressure(p, r.finalPressureMPa)}` +
      (r.evaluation ? `, ${r.evaluation.verdict}` : "");
  }
  for (const l of report.liftoffChecks ?? []) addEntry(snapshot, liftoffEntry(report, l));
  for (const d of report.detensions ?? []) addEntry(snapshot, detensionEntry(report, d));
  for (const c of report.concreteResults ?? [])
    snapshot[`concrete result ${formatDateTime(c.at, report.timeZone)}`] = concreteResultText(p, report.timeZone, c);
  (report.reopenings ?? []).forEach((o, i) => {
    snapshot[`reopening ${i + 1}`] = `reopened by ${o.byName} on ${formatDateTime(o.at, report.timeZone)}: ${o.reason}`;
  });
  for (const f of report.flags) {
    snapshot[`flag ${f.reference} (${f.tendonTag})`] = f.status === "with_engineer" ? "with the engineer" : f.status;
    for (const d of f.dispositions)
      snapshot[`disposition ${d.reference} (${f.tendonTag})`] = d.decision.replace(/_/g, " ");
  }
  return snapshot;
}

type EntryReport = Pick<PourReport, "project" | "tendons" | "timeZone">;
const tagOf = (report: EntryReport, tendonId: string) =>
  report.tendons.find((t) => t.tendonId === tendonId)?.tag ?? "?";
/** Puts a named entry into a snapshot. */
export const addEntry = (snapshot: ReportSnapshot, [key, value]: [string, string]) => {
  snapshot[key] = value;
};

/**
 * A lift-off check as a signed revision names it: "lift-off S-01 end A 2026-12-02 10:20 CST" (the
 * day's report puts the pour's name first) and its result. The pour's and the day's reports share it.
 */
export function liftoffEntry(report: EntryReport, l: ReportLiftoff, pourName?: string): [string, string] {
  const p = report.project;
  return [
    `lift-off ${pourName ? `${pourName} ` : ""}${tagOf(report, l.tendonId)} end ${l.end} ${formatDateTime(l.at, report.timeZone)}`,
    `${showForce(p, l.liftoffForceN)} at ${showPressure(p, l.pressureMPa)}, ${showPct(l.deviationPct)}, ${l.withinBand ? "within" : "outside"} the band`,
  ];
}

/** A detension as a signed revision names it: "detension S-01 2026-12-02 11:05 CST" and what was released. */
export function detensionEntry(report: EntryReport, d: ReportDetension, pourName?: string): [string, string] {
  return [
    `detension ${pourName ? `${pourName} ` : ""}${tagOf(report, d.tendonId)} ${formatDateTime(d.at, report.timeZone)}`,
    `${d.strands} strand${d.strands === 1 ? "" : "s"} released` +
      `${d.releasePressureMPa !== null ? ` at ${showPressure(report.project, d.releasePressureMPa)}` : ", gauge not read"}` +
      `, ordered by disposition ${d.dispositionReference}`,
  ];
}

/** Lines such as "record S-01 end A stressing 2: added (revision 1, …)" or "flag F-0003 (S-01): open → closed". */
export function describeChanges(before: ReportSnapshot | null, after: ReportSnapshot): string[] {
  if (!before) return [];
  const keys = [...new Set([...Object.keys(before), ...Object.keys(after)])].sort();
  const lines: string[] = [];
  for (const key of keys) {
    const was = before[key];
    const now = after[key];
    if (was === now) continue;
    if (was === undefined) lines.push(`${key}: added (${now})`);
    else if (now === undefined) lines.push(`${key}: no longer in the report (was ${was})`);
    else lines.push(`${key}: ${was} → ${now}`);
  }
  return lines;
}
