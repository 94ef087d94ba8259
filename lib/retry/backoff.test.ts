import { describe, expect, it } from "vitest";
import { backoffDelayMs } from "./backoff";

const TOP = () => 0.999999;
const BOTTOM = () => 0;

describe("backoffDelayMs", () => {
  it("with full jitter waits between zero and the doubling step, and stops at the cap", () => {
    // Steps of 2 s doubling: 2 s, 4 s, 8 s, … capped at 5 min.
    const sync = { baseMs: 2_000, capMs: 300_000 };
    expect(backoffDelayMs(1, { ...sync, random: TOP })).toBe(1_999);
    expect(backoffDelayMs(3, { ...sync, random: TOP })).toBe(7_999);
    expect(backoffDelayMs(30, { ...sync, random: TOP })).toBe(299_999);
    expect(backoffDelayMs(5, { ...sync, random: BOTTOM })).toBe(0);
  });

  it("with half jitter never waits less than half the step", () => {
    const mail = { baseMs: 5_000, capMs: 30 * 60_000, jitter: 0.5 };
    expect(backoffDelayMs(1, { ...mail, random: BOTTOM })).toBe(2_500);
    expect(backoffDelayMs(1, { ...mail, random: TOP })).toBe(4_999);
    expect(backoffDelayMs(4, { ...mail, random: BOTTOM })).toBe(20_000); // step 40 s
    expect(backoffDelayMs(40, { ...mail, random: BOTTOM })).toBe(15 * 60_000);
    expect(backoffDelayMs(40, { ...mail, random: TOP })).toBe(30 * 60_000 - 1);
  });

  it("without jitter is the plain doubling step", () => {
    const plain = { baseMs: 1_000, capMs: 30_000, jitter: 0, random: TOP };
    expect([1, 2, 3, 4, 5, 6, 7].map((n) => backoffDelayMs(n, plain))).toEqual([
      1_000, 2_000, 4_000, 8_000, 16_000, 30_000, 30_000,
    ]);
  });

  it("treats zero failures as the first step and refuses a jitter outside 0 to 1", () => {
    expect(backoffDelayMs(0, { baseMs: 1_000, capMs: 30_000, jitter: 0 })).toBe(1_000);
    expect(() => backoffDelayMs(1, { baseMs: 1_000, capMs: 30_000, jitter: 1.5 })).toThrow(/jitter/);
  });
});
