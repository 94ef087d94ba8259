import { bandHalfWidthMm, resolutionEffect } from "@/lib/elongation";

/**
 * How many tendons' verdicts rest on the reading division rather than on the tendon: measured ±
 * half a division on each end read straddles a band edge. Short tendons matter most: their band
 * (7 % of a small elongation) is only a few divisions wide.
 *
 * A tendon counts as short here when its band half-width is under SHORT_BAND_DIVISIONS reading
 * divisions (at ±7 % and 1/8 in, a band under 1/2 in: a predicted elongation under about 7 in,
 * roughly an 80 ft monostrand tendon stressed to 0.80·fpu). Our own threshold, chosen so the
 * division is more than a quarter of the band half-width.
 */

export const SHORT_BAND_DIVISIONS = 4;

export interface ResolutionItem {
  tag: string;
  measuredMm: number;
  predictedMm: number;
  tolerancePct: number;
  floorMm?: number;
  /** The reading division in mm (1/8 in = 3.175 mm). */
  divisionMm: number;
  /** Ends read and summed; each carries its own half division. */
  endsRead: number;
  /** Measured total over the sum of the readings (above 1 when read from an initial pressure). */
  scale?: number;
}

export interface ResolutionShare {
  all: { n: number; couldChange: number; share: number | null };
  short: { n: number; couldChange: number; share: number | null };
  /** Tags whose verdict the division alone could change, short ones marked. */
  tendons: { tag: string; short: boolean; bandMm: number }[];
}

const share = (k: number, n: number) => (n ? k / n : null);

export function resolutionShare(items: readonly ResolutionItem[]): ResolutionShare {
  const tendons: ResolutionShare["tendons"] = [];
  let shortN = 0;
  let shortK = 0;
  for (const item of items) {
    const effectiveMm = item.divisionMm * Math.max(1, item.endsRead) * (item.scale ?? 1);
    const effect = resolutionEffect({
      measuredMm: item.measuredMm,
      predictedMm: item.predictedMm,
      tolerancePct: item.tolerancePct,
      floorMm: item.floorMm,
      resolutionMm: effectiveMm,
    });
    const bandMm = bandHalfWidthMm(item.predictedMm, item.tolerancePct, item.floorMm ?? 0);
    const short = bandMm < SHORT_BAND_DIVISIONS * item.divisionMm;
    if (short) shortN++;
    if (effect.couldChangeVerdict) {
      tendons.push({ tag: item.tag, short, bandMm });
      if (short) shortK++;
    }
  }
  return {
    all: { n: items.length, couldChange: tendons.length, share: share(tendons.length, items.length) },
    short: { n: shortN, couldChange: shortK, share: share(shortK, shortN) },
    tendons,
  };
}
