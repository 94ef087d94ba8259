import { flagLabel } from "@/lib/schemas/flag";
import { formatDateTime, formatDay } from "@/lib/format/dates";
import {
  readingResolution,
  showArea,
  showComputedLength,
  showForce,
  showLength,
  showLongLength,
  showModulus,
  showPct,
  showPressure,
  showStrength,
  showWobble,
  pressureAsTyped,
} from "@/lib/format/quantities";
import { MPA_PER_PSI } from "@/lib/units";
import { JACKING_LIMIT_FPU_FRACTION } from "@/lib/elongation";
import { DECISION_LABELS } from "@/lib/schemas/review";
import { wireBreakWords } from "@/lib/schemas/record";
import type { PourReport, ReportDetension, ReportLiftoff } from "@/lib/server/get-pour-report";
import { concreteResultText } from "./concrete-lines";
import type { PourRecord } from "@/lib/server/list-pour-records";
import type { TendonResult } from "@/lib/server/list-tendon-results";

/**
 * The report's content as display strings in the project's units, once: the PDF draws them and
 * the CSV writes them, so both carry exactly the same rows and columns. Dates and times go through
 * lib/format/dates in the project's time zone (the site's, not the tablet's); people and flags by name and reference.
 */

export const RECORD_COLUMNS = [
  "Tendon",
  "End",
  "Stressing",
  "Stressed",
  "Operator",
  "Equipment set",
  "Jack, gauge, pump",
  "Calibration",
  "Initial pressure",
  "Final pressure",
  "Target pressure",
  "Force",
  "Force from elongation",
  "Readings as entered",
  "Seating",
  "Measured",
  "Predicted (Tautline)",
  "Predicted (shop drawing)",
  "Governs",
  "Deviation",
  "Verdict",
  "Basis",
  "Wire breaks",
  "Remarks",
  "Photos",
  "Flags",
] as const;

export type RecordColumn = (typeof RECORD_COLUMNS)[number];

const VERDICT_WORDS = { "in band": "In band", long: "Long", short: "Short", incomplete: "Incomplete" } as const;

export function verdictText(t: TendonResult): string {
  if (!t.evaluation) return "Not stressed";
  const word = VERDICT_WORDS[t.evaluation.verdict];
  return t.evaluation.provisional ? `${word} (provisional)` : word;
}

/** A moment in the report's time zone: "2026-12-02 14:05 CST". */
export const reportTime = (report: Pick<PourReport, "timeZone">, d: Date) => formatDateTime(d, report.timeZone);
export const reportDay = (report: Pick<PourReport, "timeZone">, d: Date) => formatDay(d, report.timeZone);

function stressingLabel(r: PourRecord): string {
  const kind = r.stressing === 1 ? "original" : r.restressOrdered ? "restress (ordered)" : "restress";
  const revised = r.revision > 1 ? `, revision ${r.revision}` : "";
  return `${r.stressing} ${kind}${revised}`;
}

function readingsText(p: PourReport["project"], r: PourRecord): string {
  const parts: string[] = [];
  if (r.method === "marks" && r.entered.marks)
    parts.push(`marks ${r.entered.marks.before} before, ${r.entered.marks.after} after`);
  if (r.method === "strokes" && r.entered.strokes?.length)
    parts.push(r.entered.strokes.map((s, i) => `stroke ${i + 1}: ${s}`).join(", "));
  // Read again finer: the first reading above, the re-read judged.
  if (r.firstReadingMm && r.entered.reread?.marksAfter)
    parts.push(`read again: ${r.entered.reread.marksAfter} after (judged)`);
  if (r.firstReadingMm && r.entered.reread?.strokes?.length)
    parts.push(`read again: ${r.entered.reread.strokes.map((s, i) => `stroke ${i + 1}: ${s}`).join(", ")} (judged)`);
  if (r.rereadDeclinedReason) parts.push(`not read again finer: ${r.rereadDeclinedReason}`);
  if (r.gaugeSteps?.length) parts.push(gaugeStepsText(p, r));
  if (r.method === "strokes" && r.drawIn && r.drawIn.deductedMm > 0)
    parts.push(
      `less ${showComputedLength(p, r.drawIn.deductedMm)} draw-in (${showComputedLength(p, r.drawIn.usedMm)} per re-grip, ${r.drawIn.source === "record" ? "as typed" : "the equipment set's"})`,
    );
  if (!parts.length) parts.push(`${r.method === "marks" ? "marks" : "strokes"} (typed values not kept)`);
  return parts.join("; ");
}

/** "gauge steps 800 psi: 1 in, 1,600 psi: 2 1/4 in …; line r² 0.9995, adds 1 in below the initial pressure". */
export function gaugeStepsText(p: PourReport["project"], r: Pick<PourRecord, "gaugeSteps" | "stepFit">): string {
  const steps = (r.gaugeSteps ?? [])
    .map(
      (st) =>
        `${st.pressure ?? showPressure(p, st.pressureMPa)}${st.pressure && !/[a-z]/i.test(st.pressure) ? ` ${p.unitSystem === "us" ? "psi" : "MPa"}` : ""}: ` +
        `${st.reading ?? showLength(p, st.readingMm)}${st.reading && !/[a-z"']/i.test(st.reading) ? ` ${p.unitSystem === "us" ? "in" : "mm"}` : ""}`,
    )
    .join(", ");
  const line = r.stepFit
    ? `; least-squares line r² ${r.stepFit.r2.toFixed(4)}, adds ${showComputedLength(p, r.stepFit.belowReferenceMm)} below the initial pressure`
    : "; no line judged";
  return `gauge steps ${steps}${line}`;
}

/** "final +9.5 % off target, confirmed by the crew: needle sticks"; empty without a confirmation. */
export function offTargetText(r: Pick<PourRecord, "gaugeOffTarget">): string {
  const o = r.gaugeOffTarget;
  return o ? `final ${showPct(o.pct)} off target, confirmed by the crew: ${o.reason}` : "";
}

function calibrationText(report: PourReport, r: PourRecord): string {
  const c = r.calibration;
  if (!c) return "none on file for that day";
  const certificate = c.certificate ? `certificate ${c.certificate}` : "no certificate uploaded";
  const state = c.inForce ? "" : ` NOT IN FORCE on ${reportDay(report, r.deviceTime)}`;
  const reason = r.expiredCalibrationReason ? ` (crew: ${r.expiredCalibrationReason})` : "";
  return `${c.calibratedOn} to ${c.validUntil}${c.laboratory ? `, ${c.laboratory}` : ""}; ${certificate}${state}${reason}`;
}

/** The gauge pressure at release as typed, with the project's units beside when they read differently. */
function releaseText(
  p: PourReport["project"],
  entered: { pressure: string; unit: "psi" | "MPa" },
  mpa: number | null,
): string {
  return pressureAsTyped(p, entered, mpa);
}

/** What a row of the records table stands for. */
export type RecordRowSource =
  | { kind: "stressing"; record: PourRecord }
  | { kind: "detension"; detension: ReportDetension }
  | { kind: "liftoff"; liftoff: ReportLiftoff }
  | { kind: "not stressed"; tendon: TendonResult };

/** One row per stressing of each end in order; a tendon not yet stressed has one row saying so. */
export function recordRows(report: PourReport): string[][] {
  return recordRowsWithSources(report).map((row) => row.cells);
}

/**
 * The rows of `recordRows`, each with what it stands for (a stressing, a detension, a lift-off
 * check, or a tendon with nothing recorded), for a reader that adds columns of its own or draws a
 * row from its record.
 */
export function recordRowsWithSources(report: PourReport): { cells: string[]; source: RecordRowSource }[] {
  const p = report.project;
  const flagsOf = (tag: string) =>
    report.flags
      .filter((f) => f.tendonTag === tag)
      .map(
        (f) =>
          `flag ${f.reference} ${flagLabel(f.kind)}: ${f.status === "with_engineer" ? "with the engineer" : f.status}`,
      )
      .join("; ");
  const rows: { row: Record<RecordColumn, string>; source: RecordRowSource }[] = [];
  for (const t of report.tendons) {
    const records = report.records.filter((r) => r.tendonId === t.tendonId);
    // The tendon's detensions stand in its sequence, before the first stressing made after them.
    const detensions = (report.detensions ?? []).filter((d) => d.tendonId === t.tendonId);
    const detensionRow = (d: (typeof detensions)[number]): Record<RecordColumn, string> => ({
      ...(Object.fromEntries(RECORD_COLUMNS.map((c) => [c, ""])) as Record<RecordColumn, string>),
      Tendon: t.tag,
      End: "",
      Stressing: `Detension (ordered by disposition ${d.dispositionReference})`,
      Stressed: formatDateTime(d.at, report.timeZone),
      Operator: d.operator,
      "Equipment set": d.equipment.name,
      "Jack, gauge, pump": `jack ${d.equipment.jackSerial}, gauge ${d.equipment.gaugeSerial}, pump ${d.equipment.pumpSerial ?? "not recorded"}`,
      "Final pressure": d.entered
        ? `at release: ${releaseText(p, d.entered, d.releasePressureMPa)}`
        : "at release: not read",
      "Readings as entered": `${d.strands} strand${d.strands === 1 ? "" : "s"} detensioned`,
      Verdict: records.some((r) => r.deviceTime.getTime() > d.at.getTime())
        ? "Detensioned; stressed again after"
        : "Detensioned: restress required",
      Remarks: [d.remarks, `recorded by ${d.recordedBy}`].filter(Boolean).join("; "),
      Flags: flagsOf(t.tag),
    });
    // The tendon's lift-off checks stand in its sequence the same way.
    const liftoffRow = (l: ReportLiftoff): Record<RecordColumn, string> => ({
      ...(Object.fromEntries(RECORD_COLUMNS.map((c) => [c, ""])) as Record<RecordColumn, string>),
      Tendon: t.tag,
      End: l.end,
      Stressing: `Lift-off check (ordered by disposition ${l.dispositionReference})`,
      Stressed: formatDateTime(l.at, report.timeZone),
      Operator: l.operator,
      "Equipment set": l.equipment.name,
      "Jack, gauge, pump": `jack ${l.equipment.jackSerial}, gauge ${l.equipment.gaugeSerial}, pump ${l.equipment.pumpSerial ?? "not recorded"}`,
      Calibration: `${l.calibration.calibratedOn} to ${l.calibration.validUntil}${l.calibration.laboratory ? `, ${l.calibration.laboratory}` : ""}`,
      "Final pressure": `${releaseText(p, l.entered, l.pressureMPa)} at lift-off`,
      Force: `${showForce(p, l.liftoffForceN)} at lift-off; ${showForce(p, l.expectedForceN)} expected after seating`,
      Deviation: showPct(l.deviationPct),
      Verdict: `Lift-off ${l.withinBand ? "within" : "outside"} the ±${l.bandPct} % band`,
      Basis: "force at the anchorage after seating (Tautline's force profile)",
      Remarks: l.raisedFlagReference ? `raised flag ${l.raisedFlagReference}` : "",
      Flags: flagsOf(t.tag),
    });
    const between: { at: Date; row: () => Record<RecordColumn, string>; source: RecordRowSource }[] = [
      ...detensions.map((d) => ({
        at: d.at,
        row: () => detensionRow(d),
        source: { kind: "detension" as const, detension: d },
      })),
      ...(report.liftoffChecks ?? [])
        .filter((l) => l.tendonId === t.tendonId)
        .map((l) => ({ at: l.at, row: () => liftoffRow(l), source: { kind: "liftoff" as const, liftoff: l } })),
    ].sort((a, b) => a.at.getTime() - b.at.getTime());
    if (!records.length && !between.length) {
      rows.push({
        row: {
          ...Object.fromEntries(RECORD_COLUMNS.map((c) => [c, ""])),
          Tendon: t.tag,
          Verdict: "Not stressed",
          "Predicted (Tautline)": "",
          Flags: flagsOf(t.tag),
        } as Record<RecordColumn, string>,
        source: { kind: "not stressed", tendon: t },
      });
      continue;
    }
    let shown = 0;
    const next = () => {
      const item = between[shown++]!;
      rows.push({ row: item.row(), source: item.source });
    };
    for (const r of records) {
      while (shown < between.length && between[shown]!.at.getTime() < r.deviceTime.getTime()) next();
      const e = r.evaluation;
      const verdict = e
        ? VERDICT_WORDS[e.verdict] + (e.provisional ? " (provisional)" : "") + (e.current ? "" : " (superseded)")
        : "Not evaluated";
      const row: Record<RecordColumn, string> = {
        Tendon: t.tag,
        End: r.end,
        Stressing: stressingLabel(r),
        Stressed: formatDateTime(r.deviceTime, report.timeZone),
        Operator: r.operator,
        "Equipment set": r.equipment.name,
        "Jack, gauge, pump": `jack ${r.equipment.jackSerial}, gauge ${r.equipment.gaugeSerial}, pump ${r.equipment.pumpSerial ?? "not recorded"}`,
        Calibration: calibrationText(report, r),
        "Initial pressure": r.initialPressureMPa !== null ? showPressure(p, r.initialPressureMPa) : "none (from zero)",
        "Final pressure": showPressure(p, r.finalPressureMPa),
        "Target pressure":
          (r.targetPressureMPa !== null ? showPressure(p, r.targetPressureMPa) : "no calibration") +
          (r.gaugeOffTarget ? `; ${offTargetText(r)}` : ""),
        Force: r.forceN !== null ? showForce(p, r.forceN) : "no calibration",
        "Force from elongation": r.elongationForce
          ? showForce(p, r.elongationForce.forceN) +
            (r.elongationForce.differencePct !== null ? ` (${showPct(r.elongationForce.differencePct)})` : "")
          : "",
        "Readings as entered": readingsText(p, r),
        Seating: r.entered.seating ?? (r.seatingMm !== null ? showLength(p, r.seatingMm) : "not read"),
        Measured: showLength(p, r.measuredMm),
        "Predicted (Tautline)": e?.predictedMm != null ? showComputedLength(p, e.predictedMm) : "",
        "Predicted (shop drawing)":
          r.shopElongationMm !== null ? showComputedLength(p, r.shopElongationMm) : "none given",
        Governs: e ? (e.governs === "shop drawing" ? "shop drawing" : "Tautline") : "",
        Deviation: e?.deviationPct != null ? showPct(e.deviationPct) : "",
        Verdict: verdict,
        Basis: e ? (e.basis === "net" ? "net of anchor set" : "gross at jacking") : "",
        "Wire breaks": r.wireBreakDetails?.length
          ? `${r.wireBreaks}: ${r.wireBreakDetails.map(wireBreakWords).join("; ")}`
          : String(r.wireBreaks),
        Remarks: [r.remarks, ...r.corrections.map((c) => `corrected to revision ${c.revision}: ${c.reason}`)]
          .filter(Boolean)
          .join("; "),
        Photos: r.photos.map((n) => `photo ${n}`).join(", "),
        Flags: flagsOf(t.tag),
      };
      rows.push({ row, source: { kind: "stressing", record: r } });
    }
    while (shown < between.length) next();
  }
  return rows.map(({ row, source }) => ({ cells: RECORD_COLUMNS.map((c) => row[c]), source }));
}

export function concreteLine(report: PourReport): string {
  const pour = report.pour;
  if (pour.concreteStrengthMPa !== null) {
    const by = pour.concreteConfirmedBy ? ` by ${pour.concreteConfirmedBy}` : "";
    const at = pour.concreteConfirmedAt ? ` on ${reportDay(report, pour.concreteConfirmedAt)}` : "";
    return `Concrete strength ${showStrength(report.project, pour.concreteStrengthMPa)} confirmed${by}${at}`;
  }
  if (report.release)
    return "Concrete strength: no test result entered in Tautline; the release stands on the engineer's statement";
  return "Concrete strength: not confirmed in Tautline";
}

/** The project's factor of fpu·A, and the tendons whose schedule row gives their own force. */
function jackingForceLine(report: PourReport): string {
  const factor = report.basis.jackingForceFactor ?? JACKING_LIMIT_FPU_FRACTION;
  const own = report.tendons.filter((t) => t.jackingForceN !== null);
  if (factor === JACKING_LIMIT_FPU_FRACTION && !own.length)
    return "0.80 · fpu · A of the specified strand (ACI 318-19 Table 20.3.2.5.1)";
  return (
    `${factor.toFixed(2)} · fpu · A of the specified strand (project setting; ACI 318-19 Table 20.3.2.5.1 allows at most 0.80)` +
    (own.length
      ? `; from the schedule for ${own.map((t) => `${t.tag} (${showForce(report.project, t.jackingForceN!)})`).join(", ")}`
      : "")
  );
}

/** The pour's concrete test results, oldest first, in the daily report's words. */
export function concreteResultLines(report: PourReport): string[] {
  return (report.concreteResults ?? []).map((c) => concreteResultText(report.project, report.timeZone, c));
}

export function basisLines(report: PourReport): [string, string][] {
  const p = report.project;
  const b = report.basis;
  const sources = [...new Set(report.tendons.map((t) => t.strand?.source).filter((s): s is string => Boolean(s)))];
  return [
    [
      "Comparison basis",
      b.comparisonBasis === "net" ? "Net of anchor set (marks read after lock-off)" : "Gross, at jacking force",
    ],
    [
      "Tolerance",
      `±${b.tolerancePct} % per tendon` +
        (b.groupTolerancePct !== null ? `; ±${b.groupTolerancePct} % on the group average` : ""),
    ],
    [
      "Short-tendon floor",
      b.shortTendonFloorMm !== null
        ? `band never narrower than ${showComputedLength(p, b.shortTendonFloorMm)}`
        : "none",
    ],
    ["Curvature friction μ", `${b.frictionMu} (project setting)`],
    ["Wobble K", `${showWobble(p, b.wobblePerM)} (project setting)`],
    ["Anchor set", `${showComputedLength(p, b.anchorSetMm)} at each stressed end (project setting)`],
    [
      "Strand inside the jack",
      b.countJackGrip ? "counted (tendon's grip length, else the equipment set's)" : "not counted",
    ],
    ["Strand area A and modulus E", sources.length ? sources.join("; ") : "no tendon evaluated yet"],
    ["Nominal strand values", "ASTM A416 nominal area and breaking strength where a tendon names no strand lot"],
    ["Jacking force", jackingForceLine(report)],
    ["Forces from gauge pressure", "least-squares line of the equipment set's calibration"],
    [
      "Predicted elongation",
      "Tautline's computation governs unless a record says the shop drawing's does; both are listed",
    ],
    ["Reading resolution", readingResolution(p.readingResolution)],
    ["Required concrete strength", b.requiredConcreteMPa !== null ? showStrength(p, b.requiredConcreteMPa) : "not set"],
    ["Engine", report.engineVersion],
  ];
}

export function strandLotLines(report: PourReport): [string, string][] {
  const p = report.project;
  return report.strandLots.map((l) => [
    l.lotNumber,
    `${l.strandSize} strand, area ${showArea(p, l.areaMm2)}, modulus ${showModulus(p, l.modulusMPa)}, ` +
      `breaking load ${showForce(p, l.breakingLoadN)} (mill certificate)`,
  ]);
}

/** A calibration dated after the report's content is never shown as the one in force. */
export function calibrationLines(report: PourReport): [string, string][] {
  const p = report.project;
  const today = reportDay(report, report.asOf);
  // The calibration line's slope per 1,000 psi (US) or per MPa (SI).
  const step = p.unitSystem === "us" ? { mpa: 1000 * MPA_PER_PSI, label: "1,000 psi" } : { mpa: 1, label: "MPa" };
  return report.equipment.map((s) => [
    s.name,
    `Jack ${s.jackSerial}, gauge ${s.gaugeSerial}, pump ${s.pumpSerial ?? "not recorded"}. ` +
      (s.calibrations.length
        ? s.calibrations
            .map((c) => {
              const state =
                c.calibratedOn > today
                  ? "dated after this report: not in force"
                  : c.validUntil < today
                    ? `expired by ${today}`
                    : `in force on ${today}`;
              return (
                `Calibrated ${c.calibratedOn}, valid until ${c.validUntil} (${state})${c.laboratory ? `, ${c.laboratory}` : ""}: ` +
                `line of ${showForce(p, c.slope * step.mpa)} per ${step.label}, ${showForce(p, c.intercept)} at zero pressure, r² ${c.r2.toFixed(5)}`
              );
            })
            .join("; ")
        : "No calibration on file."),
  ]);
}

export function flagLines(report: PourReport): { heading: string; lines: string[] }[] {
  return report.flags.map((f) => {
    const lines = [f.reason, `Raised ${reportTime(report, f.raisedAt)}.`];
    for (const r of f.reviews)
      lines.push(`Review (${r.kind.replace(/_/g, " ")}) by ${r.author}, ${reportTime(report, r.at)}: ${r.body}`);
    for (const d of f.dispositions)
      lines.push(
        `Disposition ${d.reference}: ${DECISION_LABELS[d.decision]}, by ${d.engineerName} (${d.licenceStatement}), ${reportTime(report, d.at)}: ${d.reasons}`,
      );
    if (!f.dispositions.length && f.status !== "closed") lines.push("No disposition yet.");
    if (f.closedAt)
      lines.push(
        `Closed ${reportTime(report, f.closedAt)}${f.closedBy ? ` by ${f.closedBy}` : ""}${f.closeReason ? `: ${f.closeReason}` : "."}`,
      );
    const status = f.status === "with_engineer" ? "with the engineer" : f.status;
    return { heading: `Flag ${f.reference} · ${f.tendonTag} · ${flagLabel(f.kind)} · ${status}`, lines };
  });
}

/** "Released by A on …, reopened by B on …: reason", one line per reopened release, oldest first. */
export function reopeningLines(report: PourReport): string[] {
  return (report.reopenings ?? []).map(
    (o) =>
      `Released by ${o.releasedBy} on ${reportTime(report, o.releasedAt)}, reopened by ${o.byName} on ${reportTime(report, o.at)}: ${o.reason}`,
  );
}

export function releaseLine(report: PourReport): string {
  if (!report.release)
    return `Not released. The pour is ${report.pour.status}; the ${report.project.releaseBy} releases it once no flag is open.`;
  const released = `Released by ${report.release.byName} on ${reportTime(report, report.release.at)}: "${report.release.statement}"`;
  const signature = report.release.signature;
  return signature
    ? `${released} Signed by ${signature.signerName}, licence ${signature.licence}; ` +
        `sha256 of this report's content at signing (before the release was added): ${signature.contentSha256}.`
    : released;
}

export function reportFileName(report: PourReport, extension: "pdf" | "csv", revision?: number): string {
  const suffix = revision ? `-rev${revision}` : "";
  return (
    `${report.project.code}-${report.pour.name}-stressing-report${suffix}`.replace(/[^A-Za-z0-9._-]+/g, "-") +
    `.${extension}`
  );
}

export { showLongLength };
