import { describe, expect, it } from "vitest";
import { contentSecurityPolicy, newNonce, nonceOf } from "./content-security-policy";

const directive = (policy: string, name: string) =>
  policy
    .split("; ")
    .find((d) => d.startsWith(`${name} `))
    ?.split(" ")
    .slice(1);

describe("contentSecurityPolicy", () => {
  it("runs scripts only with the request's nonce, never inline or eval in production", () => {
    const policy = contentSecurityPolicy({ nonce: "abc123==" });
    expect(directive(policy, "script-src")).toEqual(["'self'", "'nonce-abc123=='", "'strict-dynamic'"]);
    expect(policy).not.toMatch(/unsafe-eval/);
    expect(directive(policy, "script-src")).not.toContain("'unsafe-inline'");
    expect(nonceOf(policy)).toBe("abc123==");
  });

  it("keeps the framing, base, object and form limits, and lets the offline worker register", () => {
    const policy = contentSecurityPolicy({ nonce: "n" });
    expect(directive(policy, "frame-ancestors")).toEqual(["'none'"]);
    expect(directive(policy, "base-uri")).toEqual(["'self'"]);
    expect(directive(policy, "object-src")).toEqual(["'none'"]);
    expect(directive(policy, "form-action")).toEqual(["'self'"]);
    expect(directive(policy, "worker-src")).toEqual(["'self'"]);
  });

  it("allows eval only in development, and the upload store's origin for presigned uploads", () => {
    const policy = contentSecurityPolicy({ nonce: "n", dev: true, connectOrigins: ["http://127.0.0.1:4569"] });
    expect(directive(policy, "script-src")).toContain("'unsafe-eval'");
    expect(directive(policy, "connect-src")).toEqual(["'self'", "http://127.0.0.1:4569"]);
  });
});

describe("newNonce", () => {
  it("gives 128 random bits, different every time", () => {
    const nonces = new Set(Array.from({ length: 100 }, newNonce));
    expect(nonces.size).toBe(100);
    for (const n of nonces) expect(Buffer.from(n, "base64")).toHaveLength(16);
  });
});
