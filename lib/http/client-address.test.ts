import { describe, expect, it } from "vitest";
import { clientAddress } from "./client-address";

describe("clientAddress", () => {
  it("believes no forwarded-for header without a trusted proxy: a forged one neither dodges a limit nor lands in a shared bucket", () => {
    expect(clientAddress(new Headers({ "x-forwarded-for": "203.0.113.9" }), 0)).toBeNull();
    expect(clientAddress(new Headers(), 0)).toBeNull();
  });

  it("behind one trusted proxy takes the address that proxy appended, not what the client wrote before it", () => {
    const headers = new Headers({ "x-forwarded-for": "1.2.3.4, 198.51.100.7" });
    expect(clientAddress(headers, 1)).toBe("198.51.100.7");
    expect(clientAddress({ "x-forwarded-for": "spoofed, 10.0.0.1, 198.51.100.7" }, 2)).toBe("10.0.0.1");
  });

  it("answers null, not a made-up bucket, when the header is missing or not an address", () => {
    expect(clientAddress(new Headers(), 1)).toBeNull();
    expect(clientAddress({ "x-forwarded-for": "<script>" }, 1)).toBeNull();
    expect(clientAddress({ "x-forwarded-for": "2001:db8::1" }, 1)).toBe("2001:db8::1");
  });
});
