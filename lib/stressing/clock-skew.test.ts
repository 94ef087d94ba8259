import { describe, expect, it } from "vitest";
import { clockSkew } from "./clock-skew";

const received = "2026-12-02T15:00:00Z";

describe("clockSkew", () => {
  it.each([
    ["device 2 minutes behind, threshold 10", "2026-12-02T14:58:00Z", 10, null],
    ["device exactly 10 minutes behind", "2026-12-02T14:50:00Z", 10, null],
    ["device 11 minutes behind", "2026-12-02T14:49:00Z", 10, { minutes: -11, future: false }],
    ["device 30 s ahead (within the grace)", "2026-12-02T15:00:30Z", 10, null],
    ["device 5 minutes ahead: after its own receipt", "2026-12-02T15:05:00Z", 10, { minutes: 5, future: true }],
    ["device a day ahead", "2026-12-03T15:00:00Z", 10, { minutes: 1440, future: true }],
    ["device 3 minutes behind with a 2 minute threshold", "2026-12-02T14:57:00Z", 2, { minutes: -3, future: false }],
  ])("%s", (_label, device, threshold, expected) => {
    expect(clockSkew(device, received, threshold)).toEqual(expected);
  });

  it("answers null for a time it cannot read", () => {
    expect(clockSkew("not a time", received)).toBeNull();
  });
});
