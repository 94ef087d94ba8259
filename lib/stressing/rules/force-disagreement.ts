import { showForce, showPct } from "@/lib/format/quantities";
import type { TendonEnd } from "@/lib/schemas/domain";
import type { EndJudgement, JudgeProject } from "../judge";
import type { Rule } from "./types";

/**
 * Force agreement: the two ways the code asks the prestressing force to be determined, from the
 * elongation and from the calibrated gauge, compared end by end. ACI 318-11 §18.20.1 (ACI 318-19
 * §26.10, from memory) asks for both, and for the cause of a difference of more than 7 % in
 * post-tensioned construction to be found and corrected. The band is the project's elongation band
 * (±7 % by default, the same clause), widened on a short tendon to the force that the project's
 * short-tendon floor of elongation stands for, since a reading cannot tell the force any closer.
 */
export interface ForceAgreement {
  end: TendonEnd;
  gaugeForceN: number;
  impliedForceN: number;
  /** (implied − gauge)/gauge, %. */
  differencePct: number;
  /** The allowed difference, % of the gauge force. */
  bandPct: number;
  agrees: boolean;
}

// Forces from readings converted out of fractional inches carry last-bit noise: the edge is inside.
const EDGE_NOISE_PCT = 1e-9;

export function forceAgreement(
  e: EndJudgement,
  project: Pick<JudgeProject, "tolerancePct" | "shortTendonFloorMm">,
  specifiedForceN: number,
): ForceAgreement | null {
  if (e.gaugeForceN === null || !(e.gaugeForceN > 0) || e.impliedForceN === null) return null;
  const floorN =
    project.shortTendonFloorMm && e.forceBasisMm > 0
      ? (specifiedForceN * project.shortTendonFloorMm) / e.forceBasisMm
      : 0;
  const bandPct = Math.max(project.tolerancePct, (floorN / e.gaugeForceN) * 100);
  const differencePct = ((e.impliedForceN - e.gaugeForceN) / e.gaugeForceN) * 100;
  return {
    end: e.end,
    gaugeForceN: e.gaugeForceN,
    impliedForceN: e.impliedForceN,
    differencePct,
    bandPct,
    agrees: Math.abs(differencePct) <= bandPct + EDGE_NOISE_PCT,
  };
}

/** "End A: gauge 146.9 kN, elongation implies 150.2 kN (+2.2 %, within ±7 %)". */
export function forceAgreementWords(project: Parameters<typeof showForce>[0], f: ForceAgreement): string {
  return (
    `End ${f.end}: gauge ${showForce(project, f.gaugeForceN)}, elongation implies ${showForce(project, f.impliedForceN)} ` +
    `(${showPct(f.differencePct)}, ${f.agrees ? "within" : "outside"} ±${Number(f.bandPct.toFixed(1))} %)`
  );
}

/**
 * An end whose two force determinations differ by more than the band. An end whose elongation is
 * itself out of band, or a tendon the out-of-band rule flags, is left to that flag: with the gauge
 * near the specified force the two ask the engineer the same question, and one flag for one fact
 * keeps flags worth reading (the flag's e-mail and the sheet show both forces all the same). What
 * this rule adds is the elongation in band while the gauge says another force: a gauge, a
 * calibration or a reading to check before more force goes in or the tendon is accepted.
 */
export const forceDisagreement: Rule = ({ input, judgement }) => {
  const p = input.project;
  const tendonOut =
    !judgement.provisional && judgement.comparison !== null && judgement.comparison.verdict !== "in band";
  if (tendonOut) return null;
  const off = judgement.ends
    .filter((e) => e.comparison === null || e.comparison.verdict === "in band")
    .map((e) => ({ e, f: forceAgreement(e, p, judgement.specifiedForceN) }))
    .filter((x): x is { e: EndJudgement; f: ForceAgreement } => x.f !== null && !x.f.agrees);
  if (!off.length) return null;
  return {
    kind: "force_disagreement",
    reason:
      off.map((x) => forceAgreementWords(p, x.f)).join("; ") +
      ". The force from the elongation and the force from the calibrated gauge differ by more than the band: " +
      "find the cause (gauge, calibration, friction, a slipped wedge, the reading) before the tendon is accepted " +
      "(ACI 318-11 §18.20.1, from memory).",
    recordId: off[0]!.e.record.id,
  };
};
