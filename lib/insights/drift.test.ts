import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { equipmentDrift, spread, welchT, type DeviationSample } from "./drift";

// Constructed data: deviations (%) of tendons stressed by three sets. The scatter pattern is
// invented; the expected statistics are worked by hand below.
const pattern = [-2.1, 1.4, 0.3, -0.8, 2.2, -1.5, 0.9, -0.2, 1.1, -1.3];
const samples = (setId: string, offsetPct: number, values = pattern): DeviationSample[] =>
  values.map((v) => ({ setId, setName: `Set ${setId}`, deviationPct: v + offsetPct }));

describe("mean, spread and Welch's t", () => {
  it("matches a hand calculation", () => {
    // Mean of 2, 4, 4, 4, 5, 5, 7, 9 is 5; the sum of squares about it is 32, so s = √(32/7).
    const s = spread([2, 4, 4, 4, 5, 5, 7, 9]);
    expect(s.meanPct).toBe(5);
    expect(s.sdPct).toBeCloseTo(Math.sqrt(32 / 7), 12);
    expect(s.sePct).toBeCloseTo(Math.sqrt(32 / 7) / Math.sqrt(8), 12);
    // Two samples of the same spread shifted by 3: t = 3 / √(2·s²/8).
    const b = spread([5, 7, 7, 7, 8, 8, 10, 12]);
    expect(welchT(b, s)).toBeCloseTo(3 / Math.sqrt((2 * (32 / 7)) / 8), 12);
    expect(welchT(spread([1]), s)).toBeNull();
  });
});

describe("drift between equipment sets", () => {
  it("marks nothing when every set scatters about the same mean", () => {
    const result = equipmentDrift([
      ...samples("A", 0),
      ...samples("B", 0.4, [...pattern].reverse()),
      ...samples("C", -0.3),
    ]);
    expect(result.map((r) => r.setId)).toEqual(["A", "B", "C"]);
    expect(result.every((r) => !r.drifting)).toBe(true);
    expect(result.find((r) => r.setId === "A")!.n).toBe(10);
  });

  it("marks the one set that comes out 4 points long, and only that one", () => {
    const result = equipmentDrift([...samples("A", 0), ...samples("B", 4), ...samples("C", 0.2)]);
    const b = result.find((r) => r.setId === "B")!;
    expect(b.drifting).toBe(true);
    expect(b.meanPct).toBeCloseTo(4 + pattern.reduce((x, y) => x + y, 0) / 10, 12);
    expect(b.differencePct).toBeGreaterThan(3.8);
    expect(b.others?.n).toBe(20);
    expect(b.note).toMatch(/longer/);
    expect(b.note).toMatch(/calibration/);
    // Once B is marked it leaves the reference pool: A and C are compared with each other, so
    // B's long tendons do not make the sound sets look short.
    expect(result.filter((r) => r.drifting).map((r) => r.setId)).toEqual(["B"]);
    expect(result.find((r) => r.setId === "A")!.others?.n).toBe(10);
    expect(result.find((r) => r.setId === "A")!.note).toMatch(/Within 2 points/);
  });

  it("with two sets, marks the one that is also off the prediction, with the matching words", () => {
    const [a, b] = equipmentDrift([...samples("A", 0), ...samples("B", -3.5)]);
    expect(b!.drifting).toBe(true);
    expect(b!.note).toMatch(/shorter/);
    expect(b!.note).toMatch(/this gauge or jack/);
    expect(a!.drifting).toBe(false);
    expect(a!.note).toMatch(/likelier one out/);
  });

  it("with two sets both off the prediction, marks both and says either may be the one", () => {
    const [a, b] = equipmentDrift([...samples("A", 3), ...samples("B", -3)]);
    expect([a!.drifting, b!.drifting]).toEqual([true, true]);
    expect(a!.note).toMatch(/one of the two sets/);
    expect(a!.note).toMatch(/longer/);
  });

  it("does not mark a shift smaller than the practical threshold, however clear", () => {
    // No scatter at all: t is infinite, but 1.5 points is under the 2-point threshold.
    const flat = Array.from({ length: 8 }, () => 0);
    const result = equipmentDrift([...samples("A", 0, flat), ...samples("B", 1.5, flat)]);
    expect(result.every((r) => !r.drifting)).toBe(true);
    expect(result[1]!.note).toMatch(/Within 2 points/);
  });

  it("does not mark a large shift that the scatter explains", () => {
    const wide = [-9, 8, -7, 10, -6, 7, -8, 9];
    const result = equipmentDrift([...samples("A", 0, wide), ...samples("B", 3, wide)]);
    expect(result.every((r) => !r.drifting)).toBe(true);
    expect(result[1]!.note).toMatch(/within the scatter/);
  });

  it("needs enough tendons on each side before it says anything", () => {
    const result = equipmentDrift([...samples("A", 0), ...samples("B", 6, pattern.slice(0, 4))]);
    expect(result.every((r) => !r.drifting)).toBe(true);
    expect(result.find((r) => r.setId === "B")!.note).toMatch(/Too few/);
    expect(equipmentDrift(samples("A", 5))[0]!.note).toMatch(/No other set/);
  });

  it("never marks a set when all sets share one distribution shifted together (property)", () => {
    fc.assert(
      fc.property(fc.double({ min: -20, max: 20, noNaN: true }), (shift) => {
        const result = equipmentDrift([...samples("A", shift), ...samples("B", shift), ...samples("C", shift)]);
        return result.every((r) => !r.drifting);
      }),
    );
  });
});
