/**
 * Insight across a pour and a project: pure computation on evaluated tendons, no I/O.
 */
export { DRIFT_RULE, equipmentDrift, MIN_DIFFERENCE_PCT, MIN_SAMPLES, MIN_T, spread, welchT } from "./drift";
export type { DeviationSample, DriftRule, SetDrift, Spread } from "./drift";
export { resolutionShare, SHORT_BAND_DIVISIONS } from "./resolution";
export type { ResolutionItem, ResolutionShare } from "./resolution";
export { apparentModuli } from "./gauge-steps";
export type { ApparentModulus, GaugeStepRecord } from "./gauge-steps";
