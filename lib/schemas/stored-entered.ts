import { z } from "zod/mini";
import { noControlCharacters } from "./text-check";

/**
 * The parts of a record's `entered` (the values exactly as typed, ./record.ts) that are read back
 * from stored records: the gauge steps in SI and the crew's confirmation of a gauge off its target.
 * Written with `zod/mini`, so the tablet's tendon list judges its stored records without loading
 * zod's full API (that comes with the record form); the record's schema takes the same definitions.
 */

/**
 * The crew's confirmation of a final pressure farther from the target than the band: how far off
 * (%, as the tablet computed it on the calibration it used) and why it was kept.
 */
export const gaugeOffTargetSchema = z.strictObject({
  pct: z
    .number({ error: "The gauge's distance from its target must be a number (%)." })
    .check(
      z.gte(-100, "The gauge cannot be more than 100 % below its target."),
      z.lte(1000, "The gauge's distance from its target is over 1000 %."),
    ),
  reason: z
    .string({ error: "Say why the gauge is off its target." })
    .check(
      noControlCharacters(),
      z.trim(),
      z.minLength(3, "Say in a few words why the gauge is off its target."),
      z.maxLength(500, "Keep the reason the gauge is off its target under 500 characters."),
    ),
});
export type GaugeOffTarget = z.infer<typeof gaugeOffTargetSchema>;

/** A gauge step in SI: what the judge, the calculation sheet and the insight read. */
export interface GaugeStepSI {
  pressureMPa: number;
  readingMm: number;
}

const storedStepsSchema = z.object({
  gaugeSteps: z.array(z.object({ pressureMPa: z.number(), readingMm: z.number() })),
});

/** The gauge steps a stored record's `entered` carries (SI), or null when it has none. */
export function storedGaugeSteps(entered: unknown): GaugeStepSI[] | null {
  const parsed = z.safeParse(storedStepsSchema, entered);
  if (!parsed.success || !parsed.data.gaugeSteps.length) return null;
  return parsed.data.gaugeSteps.map((s) => ({ pressureMPa: s.pressureMPa, readingMm: s.readingMm }));
}

const storedOffTargetSchema = z.object({ gaugeOffTarget: gaugeOffTargetSchema });

/** The crew's off-target confirmation a stored record carries, or null. */
export function storedGaugeOffTarget(entered: unknown): GaugeOffTarget | null {
  const parsed = z.safeParse(storedOffTargetSchema, entered);
  return parsed.success ? parsed.data.gaugeOffTarget : null;
}
