/**
 * The one error type for bad input to the units and elongation code. `field` is the path of the
 * offending value as the caller named it (e.g. "segments[2].lengthMm", "readingA"), so a form can
 * put the message next to the right box and a route handler can answer 422 with it.
 */
export const INPUT_ERROR_CODES = [
  "required", // empty text, missing value or empty list
  "not-a-number", // letters, stray symbols, a number the parser cannot read
  "not-finite", // NaN or ±Infinity reached the computation
  "not-positive", // zero or negative where only a positive value makes sense
  "negative", // negative where zero is allowed but negative is not
  "not-integer", // a count that is not a whole number
  "bad-fraction", // zero denominator, or a mixed number like "8 9/8"
  "fraction-not-inches", // a fraction typed with, or defaulting to, a metric unit
  "unknown-unit", // a unit suffix that this quantity does not accept
  "not-allowed", // a value outside a closed set of choices
  "too-few", // not enough points to fit
  "out-of-range", // numbers that are each valid but inconsistent together
] as const;

export type InputErrorCode = (typeof INPUT_ERROR_CODES)[number];

export class InputError extends Error {
  readonly field: string;
  readonly code: InputErrorCode;
  /** The words without the field's path in front, for a message beside the box. */
  readonly reason: string;

  constructor(field: string, code: InputErrorCode, message: string) {
    super(`${field}: ${message}`);
    this.name = "InputError";
    this.field = field;
    this.code = code;
    this.reason = message;
  }
}

export function isInputError(error: unknown): error is InputError {
  return error instanceof InputError;
}
