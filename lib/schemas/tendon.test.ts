import { describe, expect, it } from "vitest";
import { tendonSchema } from "./tendon";

// ASTM A416 Table 1 (from memory): grade 270 strand breaks at no less than 41,300 lbf (0.5 in) and
// 58,600 lbf (0.6 in); ACI 318-19 Table 20.3.2.5.1 (from memory) limits the jacking force to
// 0.80·fpu·A: 33,040 lbf per 0.5 in strand and 46,880 lbf per 0.6 in strand; 12 × 46,880 lbf =
// 562,560 lbf = 562.56 kip = 2,502,391.9 N.
// eslint-disable-next-line tautline/no-unit-factor-literal -- NIST SP 811, the pound-force
const LBF = 4.4482216152605;

const row = (over: Record<string, unknown>) => ({
  tag: "B-1",
  kind: "bonded_multistrand",
  strandSize: "0.6 in",
  strandCount: 12,
  segments: [{ lengthMm: 12_000, angleRad: 0.1 }],
  ends: "both",
  jackGripMm: null,
  shopElongationMm: null,
  strandLotId: null,
  ...over,
});

const messagesAt = (input: unknown, field: string) => {
  const result = tendonSchema.safeParse(input);
  return result.success ? [] : result.error.issues.filter((i) => i.path[0] === field).map((i) => i.message);
};

describe("tendon schema: the schedule's jacking force", () => {
  it("takes none (the project's factor), or a force up to 0.80·fpu·A of the tendon's strands", () => {
    expect(tendonSchema.safeParse(row({})).success).toBe(true);
    expect(tendonSchema.safeParse(row({ jackingForceN: null })).success).toBe(true);
    // 0.75·fpu·A, the bridge practice the issue names: 12 × 0.75 × 58,600 lbf.
    expect(tendonSchema.safeParse(row({ jackingForceN: 12 * 0.75 * 58_600 * LBF })).success).toBe(true);
    // Exactly 0.80·fpu·A is the limit itself, not above it.
    expect(tendonSchema.safeParse(row({ jackingForceN: 12 * 46_880 * LBF })).success).toBe(true);
  });

  it("refuses a force above 0.80·fpu·A on the jacking force, with the limit in kip and kN", () => {
    expect(messagesAt(row({ jackingForceN: 12 * 46_880 * LBF * 1.001 }), "jackingForceN")).toEqual([
      "The jacking force is above 0.80·fpu·A = 562.56 kip (2502.39 kN) for 12 × 0.6 in strand (ACI 318-19 Table 20.3.2.5.1); give at most that, or leave it empty for the project's factor.",
    ]);
    // The limit follows the strand: 33.04 kip suits one 0.5 in strand, not one 0.375 in strand.
    const halfInch = { kind: "unbonded_monostrand", strandSize: "0.5 in", strandCount: 1, ends: "A" };
    expect(messagesAt(row({ ...halfInch, jackingForceN: 33_040 * LBF }), "jackingForceN")).toEqual([]);
    expect(
      messagesAt(row({ ...halfInch, strandSize: "0.375 in", jackingForceN: 33_040 * LBF }), "jackingForceN"),
    ).toHaveLength(1);
  });

  it("refuses zero, a negative force and text, naming the jacking force", () => {
    expect(messagesAt(row({ jackingForceN: 0 }), "jackingForceN")).toEqual(["The jacking force must be above 0."]);
    expect(messagesAt(row({ jackingForceN: -1 }), "jackingForceN")).toEqual(["The jacking force must be above 0."]);
    expect(messagesAt(row({ jackingForceN: "150 kN" }), "jackingForceN")).toEqual(["Give the jacking force."]);
  });
});
