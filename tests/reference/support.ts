/** Helpers shared by the unit and reference tests of lib/elongation and lib/units. */
import { expect } from "vitest";
import { InputError } from "../../lib/units/errors";
import type { TendonInput } from "../../lib/elongation/types";

/** Asserts that `run` throws an InputError for `field` with `code`, and that the message names it. */
export function expectInputError(run: () => unknown, field: string, code: InputError["code"]): void {
  let caught: unknown;
  try {
    run();
  } catch (error) {
    caught = error;
  }
  expect(caught, `expected an InputError for ${field}`).toBeInstanceOf(InputError);
  expect((caught as InputError).field).toBe(field);
  expect((caught as InputError).code).toBe(code);
  expect((caught as InputError).message).toContain(field);
}

/**
 * A plainly arbitrary tendon used as a starting point in tests: one 0.5 in strand, three
 * segments with some curvature, greased-strand friction in the usual range. Not a published case.
 */
export function sampleTendon(overrides: Partial<TendonInput> = {}): TendonInput {
  return {
    segments: [
      { lengthMm: 10_000, angleRad: 0.1 },
      { lengthMm: 15_000, angleRad: 0.2 },
      { lengthMm: 5_000, angleRad: 0 },
    ],
    strandAreaMm2: 98.7,
    strandCount: 1,
    modulusMPa: 196_500,
    jackingForceN: 147_000,
    wobblePerM: 0.0033,
    mu: 0.07,
    ends: "A",
    ...overrides,
  };
}

/** Every number reachable in a plain data result (for "never NaN" checks). */
export function numbersIn(value: unknown): number[] {
  if (typeof value === "number") return [value];
  if (value === null || typeof value !== "object") return [];
  return Object.values(value).flatMap(numbersIn);
}
