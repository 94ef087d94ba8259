/**
 * Code limits and defaults used by the checks. Editions differ and project specifications
 * govern; these are the defaults a project starts from.
 */

/** Jacking force limit for low-relaxation strand, fraction of fpu (ACI 318-19 Table 20.3.2.5.1, from memory). */
export const JACKING_LIMIT_FPU_FRACTION = 0.8;
/** At post-tensioning anchorages immediately after force transfer (same table, from memory). */
export const ANCHORAGE_LIMIT_FPU_FRACTION = 0.7;
/** Elongation agreement for post-tensioning (ACI 318-11 §18.20.1, carried into later editions). */
export const DEFAULT_TOLERANCE_PCT = 7;
/** A line through fewer points cannot show a bad one; r² below this means a scattered chart (common practice). */
export const MIN_CALIBRATION_POINTS = 3;
export const MIN_CALIBRATION_R2 = 0.99;
