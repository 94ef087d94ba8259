import { flagLabel } from "@/components/ui/verdict-badge";
import type { PourReport } from "@/lib/server/get-pour-report";
import type { TendonResult } from "@/lib/server/list-tendon-results";
import { DECISION_LABELS } from "@/lib/schemas/review";
import { readingResolution, showComputedLength, showForce, showLength, showPct, showPressure, type DisplayUnits } from "@/lib/stressing/display";

/**
 * The report's tables as display strings in the project's units: the PDF draws them and the CSV
 * writes them, so both carry exactly the same rows and columns.
 */

export const TENDON_COLUMNS = [
  "Tendon",
  "Ends",
  "Strands",
  "Length",
  "Strand",
  "End",
  "Equipment set",
  "Gauge pressure",
  "Force",
  "Measured",
  "Measured total",
  "Predicted",
  "Deviation",
  "Verdict",
  "Evaluated (UTC)",
  "Flags",
] as const;

export type TendonColumn = (typeof TENDON_COLUMNS)[number];

const VERDICT_WORDS = { "in band": "In band", long: "Long", short: "Short", incomplete: "Incomplete" } as const;

export function verdictText(t: TendonResult): string {
  if (!t.evaluation) return "Not stressed";
  const word = VERDICT_WORDS[t.evaluation.verdict];
  return t.evaluation.provisional ? `${word} (provisional)` : word;
}

export function showLongLength(project: DisplayUnits, mm: number): string {
  return project.unitSystem === "us" ? `${(mm / 304.8).toFixed(1)} ft` : `${(mm / 1000).toFixed(2)} m`;
}

export const isoMinute = (d: Date) => `${d.toISOString().slice(0, 16).replace("T", " ")} UTC`;
export const isoDay = (d: Date) => d.toISOString().slice(0, 10);

/**
 * One row per tendon end that was read (a tendon not yet stressed has one row with its schedule
 * alone). The tendon's own columns repeat on each of its rows so every row stands by itself.
 */
export function tendonRows(report: PourReport): string[][] {
  const p = report.project;
  const flagsOf = (tag: string) =>
    report.flags
      .filter((f) => f.tendonTag === tag)
      .map((f) => `${flagLabel(f.kind)}: ${f.status === "with_engineer" ? "with the engineer" : f.status}`)
      .join("; ");
  return report.tendons.flatMap((t) => {
    const e = t.evaluation;
    const own = {
      Tendon: t.tag,
      Ends: t.ends === "both" ? "A and B" : t.ends,
      Strands: `${t.strandCount} × ${t.strandSize}`,
      Length: showLongLength(p, t.lengthMm),
      // Area and modulus of each lot are in the report's strand lot table.
      Strand: t.strand ? t.strand.source.replace("strand lot", "lot") : t.lotNumber ? `lot ${t.lotNumber}` : "nominal",
      "Measured total": e?.measuredMm != null ? showLength(p, e.measuredMm) : "",
      Predicted: e?.predictedMm != null ? showComputedLength(p, e.predictedMm) : "",
      Deviation: e?.deviationPct != null ? showPct(e.deviationPct) : "",
      Verdict: verdictText(t),
      "Evaluated (UTC)": e ? e.createdAt.toISOString().slice(0, 16).replace("T", " ") : "",
      Flags: flagsOf(t.tag),
    };
    const ends = t.endResults.length
      ? t.endResults.map((r) => ({
          End: r.end,
          "Equipment set": r.equipmentSetName,
          "Gauge pressure": r.initialPressureMPa
            ? `${showPressure(p, r.initialPressureMPa)} to ${showPressure(p, r.finalPressureMPa)}`
            : showPressure(p, r.finalPressureMPa),
          Force: r.forceN !== null ? showForce(p, r.forceN) : "no calibration",
          Measured: showLength(p, r.measuredMm) + (r.revision > 1 ? ` (rev. ${r.revision})` : ""),
        }))
      : [{ End: "", "Equipment set": "", "Gauge pressure": "", Force: "", Measured: "" }];
    return ends.map((end) => {
      const row: Record<TendonColumn, string> = { ...own, ...end };
      return TENDON_COLUMNS.map((c) => row[c]);
    });
  });
}

export function basisLines(report: PourReport): [string, string][] {
  const p = report.project;
  const b = report.basis;
  const wobble = p.unitSystem === "us" ? `${(b.wobblePerM * 0.3048).toFixed(4)} per ft` : `${b.wobblePerM.toFixed(4)} per m`;
  const sources = [...new Set(report.tendons.map((t) => t.strand?.source).filter((s): s is string => Boolean(s)))];
  return [
    ["Comparison basis", b.comparisonBasis === "net" ? "Net of anchor set (marks read after lock-off)" : "Gross, at jacking force"],
    ["Tolerance", `±${b.tolerancePct} % per tendon` + (b.groupTolerancePct !== null ? `; ±${b.groupTolerancePct} % on the group average` : "")],
    ["Short-tendon floor", b.shortTendonFloorMm !== null ? `band never narrower than ${showComputedLength(p, b.shortTendonFloorMm)}` : "none"],
    ["Curvature friction μ", `${b.frictionMu} (project setting)`],
    ["Wobble K", `${wobble} (project setting)`],
    ["Anchor set", `${showComputedLength(p, b.anchorSetMm)} at each stressed end (project setting)`],
    ["Strand inside the jack", b.countJackGrip ? "counted (tendon's grip length, else the equipment set's)" : "not counted"],
    ["Strand area A and modulus E", sources.length ? sources.join("; ") : "no tendon evaluated yet"],
    ["Nominal strand values", "ASTM A416 nominal area and breaking strength where a tendon names no strand lot"],
    ["Jacking force", "0.80 · fpu · A of the specified strand (ACI 318-19 Table 20.3.2.5.1)"],
    ["Forces from gauge pressure", "least-squares line of the equipment set's calibration"],
    ["Reading resolution", readingResolution(p.readingResolution)],
    ["Engine", report.engineVersion],
  ];
}

export function flagLines(report: PourReport): { heading: string; lines: string[] }[] {
  return report.flags.map((f) => {
    const lines = [f.reason, `Raised ${isoMinute(f.raisedAt)}.`];
    for (const r of f.reviews) lines.push(`Review (${r.kind.replace(/_/g, " ")}) by ${r.author}, ${isoMinute(r.at)}: ${r.body}`);
    for (const d of f.dispositions)
      lines.push(`Disposition: ${DECISION_LABELS[d.decision]}, by ${d.engineerName} (${d.licenceStatement}), ${isoMinute(d.at)}: ${d.reasons}`);
    if (!f.dispositions.length && f.status !== "closed") lines.push("No disposition yet.");
    if (f.closedAt)
      lines.push(`Closed ${isoMinute(f.closedAt)}${f.closedBy ? ` by ${f.closedBy}` : ""}${f.closeReason ? `: ${f.closeReason}` : "."}`);
    const status = f.status === "with_engineer" ? "with the engineer" : f.status;
    return { heading: `${f.tendonTag} · ${flagLabel(f.kind)} · ${status}`, lines };
  });
}

export function releaseLine(report: PourReport): string {
  if (!report.release) return `Not released. The pour is ${report.pour.status}; the ${report.project.releaseBy} releases it once no flag is open.`;
  return `Released by ${report.release.byName} on ${isoMinute(report.release.at)}: "${report.release.statement}"`;
}

export function reportFileName(report: PourReport, extension: "pdf" | "csv"): string {
  return `${report.project.code}-${report.pour.name}-stressing-report`.replace(/[^A-Za-z0-9._-]+/g, "-") + `.${extension}`;
}
