/**
 * Mean deviation per equipment set and a drift mark when one set's tendons come out
 * systematically longer or shorter than the others'. Elongation is proportional to force, so a
 * gauge that reads 3 % low (the jack pulls 3 % more than the gauge says) moves every tendon that
 * set stresses by about +3 %, while tendon-to-tendon scatter from friction and reading moves
 * them both ways. A set's mean against the pooled mean of the other sets separates the two.
 *
 * The rule, all three parts required:
 * - at least MIN_SAMPLES complete tendons on the set and on the others together, so one odd
 *   tendon cannot raise it;
 * - the difference of means is at least MIN_DIFFERENCE_PCT percentage points, a shift the size
 *   of the ±2 % force accuracy commonly asked of a jack-and-gauge calibration (from memory;
 *   the project's specification governs), so a statistically clear but harmless shift does not;
 * - Welch's two-sample statistic t = Δ / √(s₁²/n₁ + s₂²/n₂) is at least MIN_T. |t| ≥ 3 would
 *   arise by chance about 3 times in 1,000 for normal scatter with large samples (normal table),
 *   and less often than 1 in 50 even at five samples a side (Student t, few degrees of freedom),
 *   strict enough to look at several sets at once without crying wolf.
 */

export const MIN_SAMPLES = 5;
export const MIN_DIFFERENCE_PCT = 2;
export const MIN_T = 3;

export interface DeviationSample {
  setId: string;
  setName: string;
  deviationPct: number;
}

export interface Spread {
  n: number;
  meanPct: number;
  /** Sample standard deviation (n − 1); 0 for a single sample. */
  sdPct: number;
  /** Standard error of the mean, sd/√n. */
  sePct: number;
}

export interface SetDrift extends Spread {
  setId: string;
  setName: string;
  /** The other sets' samples pooled together; null when there are none. */
  others: Spread | null;
  /** This set's mean less the others' pooled mean, in percentage points. */
  differencePct: number | null;
  /** Welch's t for the difference; null when it cannot be formed. */
  t: number | null;
  drifting: boolean;
  /** Plain words: why the set is or is not marked. */
  note: string;
}

export function spread(values: readonly number[]): Spread {
  const n = values.length;
  if (!n) return { n: 0, meanPct: NaN, sdPct: NaN, sePct: NaN };
  const mean = values.reduce((a, b) => a + b, 0) / n;
  const variance = n > 1 ? values.reduce((s, v) => s + (v - mean) ** 2, 0) / (n - 1) : 0;
  const sd = Math.sqrt(variance);
  return { n, meanPct: mean, sdPct: sd, sePct: sd / Math.sqrt(n) };
}

/** Welch's statistic for two means; Infinity when both spreads are zero and the means differ. */
export function welchT(a: Spread, b: Spread): number | null {
  if (a.n < 2 || b.n < 2) return null;
  const se = Math.sqrt(a.sdPct ** 2 / a.n + b.sdPct ** 2 / b.n);
  const diff = a.meanPct - b.meanPct;
  if (se === 0) return diff === 0 ? 0 : Math.sign(diff) * Infinity;
  return diff / se;
}

export interface DriftRule {
  minSamples: number;
  minDifferencePct: number;
  minT: number;
}

export const DRIFT_RULE: DriftRule = { minSamples: MIN_SAMPLES, minDifferencePct: MIN_DIFFERENCE_PCT, minT: MIN_T };

interface Comparison {
  mine: Spread;
  others: Spread | null;
  differencePct: number | null;
  t: number | null;
  verdict: "no-others" | "too-few" | "small" | "scatter" | "drift";
}

function compare(own: number[], rest: number[], rule: DriftRule): Comparison {
  const mine = spread(own);
  const others = rest.length ? spread(rest) : null;
  const differencePct = others ? mine.meanPct - others.meanPct : null;
  const t = others ? welchT(mine, others) : null;
  let verdict: Comparison["verdict"] = "drift";
  if (!others) verdict = "no-others";
  else if (mine.n < rule.minSamples || others.n < rule.minSamples) verdict = "too-few";
  else if (Math.abs(differencePct!) < rule.minDifferencePct) verdict = "small";
  else if (t === null || Math.abs(t) < rule.minT) verdict = "scatter";
  return { mine, others, differencePct, t, verdict };
}

/**
 * Each set against the pooled tendons of the sets not marked: the set that stands out most is
 * marked first and leaves the reference pool, so one drifting set does not drag the others'
 * pooled mean far enough to mark a sound set. With only two sets that differ, the one whose own
 * mean also stands clear of the prediction (zero deviation) is marked; when that does not
 * single one out, both are: either may be the one out of calibration.
 */
export function equipmentDrift(samples: readonly DeviationSample[], rule: DriftRule = DRIFT_RULE): SetDrift[] {
  const finite = samples.filter((s) => Number.isFinite(s.deviationPct));
  const ids = [...new Set(finite.map((s) => s.setId))];
  const values = (id: string) => finite.filter((s) => s.setId === id).map((s) => s.deviationPct);
  const pool = (exclude: Set<string>) => finite.filter((s) => !exclude.has(s.setId)).map((s) => s.deviationPct);
  const marked = new Set<string>();
  const judged = ids.filter((id) => values(id).length >= rule.minSamples);

  for (;;) {
    const candidates = judged
      .filter((id) => !marked.has(id))
      .map((id) => ({ id, c: compare(values(id), pool(new Set([...marked, id])), rule) }))
      .filter((x) => x.c.verdict === "drift")
      .sort(
        (a, b) =>
          Math.abs(b.c.t!) - Math.abs(a.c.t!) ||
          Math.abs(b.c.differencePct!) - Math.abs(a.c.differencePct!) ||
          a.id.localeCompare(b.id),
      );
    const first = candidates[0];
    if (!first) break;
    if (judged.length === 2 && candidates.length === 2) {
      // Two sets that differ: the prediction breaks the tie. The set whose own mean stands
      // clear of zero by the same rule is the one marked; if both or neither do, both are.
      const offZero = judged.filter((id) => {
        const own = spread(values(id));
        const t0 = own.sePct === 0 ? (own.meanPct === 0 ? 0 : Infinity) : Math.abs(own.meanPct) / own.sePct;
        return Math.abs(own.meanPct) >= rule.minDifferencePct && t0 >= rule.minT;
      });
      for (const id of offZero.length === 1 ? offZero : judged) marked.add(id);
      break;
    }
    marked.add(first.id);
  }
  const twoOnly = judged.length === 2 && marked.size === 2;

  return ids
    .map((setId) => {
      // A marked set is compared with the sound sets; a sound set with the other sound sets
      // (or with everything else when it is the only one left).
      const soundOthers = pool(new Set([...marked, setId]));
      const reference = marked.has(setId) || !soundOthers.length ? pool(new Set([setId])) : soundOthers;
      const c = compare(values(setId), twoOnly ? pool(new Set([setId])) : reference, rule);
      const drifting = marked.has(setId);
      const d = c.differencePct;
      const t = c.t;
      let note: string;
      if (drifting) {
        note =
          `Comes out ${d! > 0 ? "longer" : "shorter"} than the other sets by ${Math.abs(d!).toFixed(1)} points ` +
          `(t = ${t !== null && Number.isFinite(t) ? t.toFixed(1) : "very large"}): a sign that ` +
          (twoOnly
            ? "one of the two sets, this or the other, may be out of calibration. "
            : "this gauge or jack may be out of calibration. ") +
          (d! > 0
            ? "Long elongations suggest the jack pulls more than the gauge shows."
            : "Short elongations suggest the jack pulls less than the gauge shows.");
      } else if (c.verdict === "no-others") note = "No other set to compare with.";
      else if (c.verdict === "too-few")
        note = `Too few tendons to judge (${c.mine.n} on this set, ${c.others!.n} on the others; ${rule.minSamples} each needed).`;
      else if (c.verdict === "small") note = `Within ${rule.minDifferencePct} points of the other sets.`;
      else if (c.verdict === "drift")
        note =
          "Differs from the marked set only; its own tendons agree with the prediction, so the marked set is the likelier one out.";
      else note = `The difference is within the scatter (t = ${t === null ? "n/a" : t.toFixed(1)}).`;
      return {
        setId,
        setName: finite.find((s) => s.setId === setId)!.setName,
        ...c.mine,
        others: c.others,
        differencePct: d,
        t,
        drifting,
        note,
      };
    })
    .sort((a, b) => a.setName.localeCompare(b.setName));
}
