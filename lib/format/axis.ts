import { nice, tickStep, ticks } from "d3-array";
import { InputError } from "@/lib/units";

/**
 * A chart axis on round values of the unit it shows: d3-array's 1, 2 or 5 times a power of ten
 * apart, the domain widened to the ticks at either end, and the decimals the step needs, so the
 * labels read "2.5 in", "30 kip" or "−6 %" and never "2.4873". The one tick helper of every chart.
 */
export interface NiceAxis {
  domain: [number, number];
  ticks: number[];
  /** Decimals a tick label needs: 0 for a step of 1, 5 or 10; 1 for 0.5 or 0.2; 2 for 0.05. */
  decimals: number;
}

export function niceAxis(lo: number, hi: number, count = 5): NiceAxis {
  if (!Number.isFinite(lo) || !Number.isFinite(hi))
    throw new InputError("axis", "not-finite", `cannot draw an axis from ${String(lo)} to ${String(hi)}`);
  if (!(count >= 1)) throw new InputError("axis", "out-of-range", "an axis needs at least one tick");
  let [a, b] = lo <= hi ? [lo, hi] : [hi, lo];
  // One value alone: open the axis around it so it has somewhere to stand.
  if (a === b) {
    const half = a === 0 ? 1 : Math.abs(a) / 10;
    a -= half;
    b += half;
  }
  const [start, stop] = nice(a, b, count);
  const step = tickStep(start, stop, count);
  return {
    domain: [start, stop],
    ticks: ticks(start, stop, count).map((t) => t + 0),
    decimals: Math.max(0, Math.ceil(-Math.log10(step) - 1e-9)),
  };
}
