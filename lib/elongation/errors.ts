import { InputError } from "../units/errors";

export { InputError, isInputError, INPUT_ERROR_CODES } from "../units/errors";
export type { InputErrorCode } from "../units/errors";

// The computation is fed from forms, the database and sync payloads; these guards make sure a
// bad value stops with the field's name instead of travelling on as NaN. Each guard is a
// one-line test that V8 inlines; building the message lives in a separate function that only
// runs on failure. (Comparisons are false for NaN and non-numbers, so one test covers those.)

/** What a guard asks of a number. */
type NumberRule = "finite" | "positive" | "non-negative" | "integer";

function reject(value: unknown, field: string, wanted: NumberRule): never {
  if (value === undefined || value === null) throw new InputError(field, "required", "a value is required");
  if (typeof value !== "number") throw new InputError(field, "not-a-number", `expected a number, got ${typeof value}`);
  if (!Number.isFinite(value)) throw new InputError(field, "not-finite", `must be a finite number, got ${value}`);
  if (wanted === "positive" || (wanted === "integer" && value <= 0)) {
    throw new InputError(field, "not-positive", `must be greater than zero, got ${value}`);
  }
  if (wanted === "non-negative") throw new InputError(field, "negative", `must not be negative, got ${value}`);
  throw new InputError(field, "not-integer", `must be a whole number, got ${value}`);
}

export function requireFinite(value: unknown, field: string): number {
  if (typeof value === "number" && value - value === 0) return value;
  return reject(value, field, "finite");
}

export function requirePositive(value: unknown, field: string): number {
  if (typeof value === "number" && value > 0 && value < Infinity) return value;
  return reject(value, field, "positive");
}

export function requireNonNegative(value: unknown, field: string): number {
  if (typeof value === "number" && value >= 0 && value < Infinity) return value;
  return reject(value, field, "non-negative");
}

export function requirePositiveInteger(value: unknown, field: string): number {
  if (typeof value === "number" && value > 0 && Number.isInteger(value)) return value;
  return reject(value, field, "integer");
}

/** Optional inputs: absent (undefined or null) stays absent, anything present must be ≥ 0. */
export function optionalNonNegative(value: unknown, field: string): number | undefined {
  return value === undefined || value === null ? undefined : requireNonNegative(value, field);
}

export function optionalPositive(value: unknown, field: string): number | undefined {
  return value === undefined || value === null ? undefined : requirePositive(value, field);
}
