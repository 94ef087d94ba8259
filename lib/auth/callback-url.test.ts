import { describe, expect, it } from "vitest";
import { env } from "@/lib/env";
import { isSafeCallbackUrl, refuseBadCallbackUrl } from "./callback-url";

const ORIGIN = new URL(env.APP_URL).origin;

describe("callbackUrl", () => {
  it.each(["/home", "/projects/abc/members?x=1", `${ORIGIN}/review`])("accepts %j", (url) => {
    expect(isSafeCallbackUrl(url)).toBe(true);
  });

  it.each([
    "//evil.example/home",
    "/\\evil.example",
    "https://evil.example/",
    "http://[bad",
    "javascript:alert(1)",
    "ht\u0000tp://x",
    "x".repeat(3000),
  ])("refuses %j", (url) => {
    expect(isSafeCallbackUrl(url)).toBe(false);
  });

  it("answers 422 naming the field for a bad one in the query, the form or the cookie, and null when all are ours", async () => {
    const bad = [
      new Request("http://localhost:3000/api/auth/signin?callbackUrl=http%3A%2F%2F%5Bbad"),
      new Request("http://localhost:3000/api/auth/signin/credentials", {
        method: "POST",
        headers: { "content-type": "application/x-www-form-urlencoded" },
        body: "email=a%40b.c&callbackUrl=https%3A%2F%2Fevil.example",
      }),
      new Request("http://localhost:3000/api/auth/session", { headers: { cookie: "next-auth.callback-url=%E0%A4%A" } }),
    ];
    for (const request of bad) {
      const answer = await refuseBadCallbackUrl(request);
      expect(answer?.status).toBe(422);
      expect(await answer!.json()).toMatchObject({ error: { fields: { callbackUrl: [expect.any(String)] } } });
    }
    const good = new Request("http://localhost:3000/api/auth/signin?callbackUrl=%2Fhome", {
      headers: { cookie: `next-auth.callback-url=${encodeURIComponent(`${ORIGIN}/home`)}` },
    });
    expect(await refuseBadCallbackUrl(good)).toBeNull();
  });
});
