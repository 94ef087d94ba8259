import { DRIFT_RULE, equipmentDrift, type DeviationSample, type SetDrift } from "@/lib/insights";
import { showPct } from "@/lib/format/quantities";

/**
 * The drift alarm during the shift: which equipment sets on a pour read long or short against the
 * other sets, from the tendons' latest complete evaluations. The pour's insight page, the
 * inspector's e-mail and the tablet all call this one function, so all three agree: the server
 * with its stored evaluations, the tablet with the evaluations the pull brought and the records
 * each one was judged on.
 *
 * A tendon counts once its latest evaluation is complete (every end in, not provisional) and
 * every end was stressed by the same set; a tendon stressed by two sets cannot be put on either
 * and is counted apart. The rule itself (at least DRIFT_RULE.minSamples tendons on the set and on
 * the others, a difference of DRIFT_RULE.minDifferencePct points, Welch's t of DRIFT_RULE.minT)
 * is lib/insights/drift.ts.
 */

export interface JudgedTendon {
  verdict: string;
  provisional: boolean;
  deviationPct: number | null;
  /** The set of each end the evaluation used (the records it names). */
  sets: { id: string; name: string }[];
}

/**
 * A tendon as the tablet holds it: its latest evaluation as pulled and the records it names, put
 * on the sets those records used. Null when the evaluation names no records or the tablet lacks one.
 */
export function judgedFromRecords(
  evaluation: { verdict: string; provisional: boolean; deviationPct: number | null; recordIds?: string[] },
  records: ReadonlyMap<string, { equipmentSetId: string }>,
  setNames: ReadonlyMap<string, string>,
): JudgedTendon | null {
  if (!evaluation.recordIds?.length) return null;
  const used = evaluation.recordIds.map((id) => records.get(id));
  if (used.some((r) => !r)) return null;
  return {
    verdict: evaluation.verdict,
    provisional: evaluation.provisional,
    deviationPct: evaluation.deviationPct,
    sets: used.map((r) => ({ id: r!.equipmentSetId, name: setNames.get(r!.equipmentSetId) ?? "A set" })),
  };
}

export function deviationSamples(tendons: readonly JudgedTendon[]): { samples: DeviationSample[]; mixed: number } {
  const samples: DeviationSample[] = [];
  let mixed = 0;
  for (const t of tendons) {
    if (t.provisional || t.deviationPct === null || t.verdict === "incomplete" || !t.sets.length) continue;
    const ids = [...new Set(t.sets.map((s) => s.id))];
    if (ids.length !== 1) {
      mixed++;
      continue;
    }
    samples.push({ setId: ids[0]!, setName: t.sets[0]!.name, deviationPct: t.deviationPct });
  }
  return { samples, mixed };
}

/** The sets on the pour whose gauge should be checked against the master gauge now. */
export function gaugeChecks(tendons: readonly JudgedTendon[]): SetDrift[] {
  return equipmentDrift(deviationSamples(tendons).samples, DRIFT_RULE).filter((d) => d.drifting);
}

/**
 * The figures in words: "Set B: mean deviation +4.6 % over 6 tendons, against +0.2 % over 8
 * tendons of the other sets (4.4 points long, t = 7.9)".
 */
export function gaugeCheckFigures(d: SetDrift): string {
  const t = d.t === null ? "n/a" : Number.isFinite(d.t) ? Math.abs(d.t).toFixed(1) : "very large";
  const diff = d.differencePct ?? 0;
  return (
    `${d.setName}: mean deviation ${showPct(d.meanPct)} over ${d.n} tendon${d.n === 1 ? "" : "s"}` +
    (d.others
      ? `, against ${showPct(d.others.meanPct)} over ${d.others.n} tendon${d.others.n === 1 ? "" : "s"} of the other sets ` +
        `(${Math.abs(diff).toFixed(1)} points ${diff > 0 ? "long" : "short"}, t = ${t})`
      : "")
  );
}
