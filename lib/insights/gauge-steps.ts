import { fitApparentStiffness, forceFromPressure, isInputError } from "@/lib/elongation";

/**
 * The apparent modulus of a tendon end read at several gauge steps: each step's pressure becomes
 * a force on the equipment set's calibration line, and the least-squares line of force against
 * reading gives the tendon's stiffness A·E/L, shown beside the mill value.
 */

export interface GaugeStepRecord {
  tag: string;
  end: "A" | "B";
  steps: readonly { pressureMPa: number; readingMm: number }[];
  calibration: { slope: number; intercept: number } | null;
  lengthMm: number;
  strandAreaMm2: number;
  strandCount: number;
  millModulusMPa: number | null;
}

export type ApparentModulus =
  | {
      tag: string;
      end: "A" | "B";
      steps: number;
      apparentModulusMPa: number;
      millModulusMPa: number | null;
      modulusRatio: number | null;
      r2: number;
    }
  | { tag: string; end: "A" | "B"; steps: number; problem: string };

export function apparentModuli(records: readonly GaugeStepRecord[]): ApparentModulus[] {
  return records
    .filter((r) => r.steps.length >= 2)
    .map((r) => {
      const base = { tag: r.tag, end: r.end, steps: r.steps.length };
      if (!r.calibration)
        return { ...base, problem: "No calibration for the equipment set, so the steps have no force." };
      const line = r.calibration;
      try {
        const fit = fitApparentStiffness({
          steps: r.steps.map((s) => ({ forceN: forceFromPressure(line, s.pressureMPa), readingMm: s.readingMm })),
          lengthMm: r.lengthMm,
          strandAreaMm2: r.strandAreaMm2,
          strandCount: r.strandCount,
          millModulusMPa: r.millModulusMPa ?? undefined,
        });
        return {
          ...base,
          apparentModulusMPa: fit.apparentModulusMPa,
          millModulusMPa: fit.millModulusMPa,
          modulusRatio: fit.modulusRatio,
          r2: fit.r2,
        };
      } catch (error) {
        if (isInputError(error)) return { ...base, problem: `The steps do not make a line: ${error.message}.` };
        throw error;
      }
    });
}
