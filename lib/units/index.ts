export * from "./errors";
export * from "./factors";
export * from "./unit-tables";
export { parseForce, parseLength, parsePressure } from "./parse";
export type { LengthParseOptions, ParseOptions } from "./parse";
export {
  formatForce,
  formatLength,
  formatLengthInward,
  formatPressure,
  READING_RESOLUTIONS,
  resolutionStepMm,
  roundToResolution,
} from "./format";
export type { ReadingResolution } from "./format";
