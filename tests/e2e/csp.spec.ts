import { expect, test, type Page } from "@playwright/test";
import { nonceOf } from "@/lib/http/content-security-policy";

/**
 * The pages' Content-Security-Policy (proxy.ts): a fresh nonce on every request, every script the
 * server writes carrying it, no inline or eval permission, and pages that still run their scripts.
 */

function scriptSources(policy: string): string[] {
  return (
    policy
      .split(";")
      .map((d) => d.trim().split(/\s+/))
      .find(([name]) => name === "script-src")
      ?.slice(1) ?? []
  );
}

/** Collects CSP violations the page reports, from its first script on. */
async function watchViolations(page: Page): Promise<() => Promise<string[]>> {
  const fromConsole: string[] = [];
  page.on("console", (m) => {
    if (/Content Security Policy/i.test(m.text())) fromConsole.push(m.text());
  });
  await page.addInitScript(() => {
    const list: string[] = [];
    (window as unknown as { __cspViolations: string[] }).__cspViolations = list;
    document.addEventListener("securitypolicyviolation", (e) => list.push(`${e.violatedDirective} ${e.blockedURI}`));
  });
  return async () => [
    ...fromConsole,
    ...(await page.evaluate(() => (window as unknown as { __cspViolations: string[] }).__cspViolations)),
  ];
}

test("every page request gets its own script nonce, without unsafe-inline or unsafe-eval", async ({ request }) => {
  const policies = [];
  for (const path of ["/", "/", "/sign-in", "/field"]) {
    const res = await request.get(path);
    expect(res.status(), path).toBe(200);
    policies.push(res.headers()["content-security-policy"] ?? "");
  }
  const nonces = policies.map(nonceOf);
  for (const [i, policy] of policies.entries()) {
    expect(nonces[i], policy).toMatch(/^[A-Za-z0-9+/]{22}==$/);
    expect(scriptSources(policy)).toEqual(["'self'", `'nonce-${nonces[i]}'`, "'strict-dynamic'"]);
    expect(policy).not.toContain("unsafe-eval");
    expect(policy).toContain("frame-ancestors 'none'");
    expect(policy).toContain("worker-src 'self'");
  }
  expect(new Set(nonces).size).toBe(nonces.length);
  // Route handlers keep the static policy of next.config.mjs (no scripts to allow there).
  const api = await request.get("/api/health");
  expect(api.headers()["content-security-policy"]).toBe(
    "frame-ancestors 'none'; base-uri 'self'; object-src 'none'; form-action 'self'",
  );
});

test("the page's scripts carry the nonce of its own response and run, with no violation", async ({ page }) => {
  const violations = await watchViolations(page);
  for (const path of ["/", "/sign-in"]) {
    const response = await page.goto(path);
    const nonce = nonceOf(response?.headers()["content-security-policy"]);
    expect(nonce).toBeTruthy();
    // Every script the server wrote into the page carries the response's nonce.
    const served = [...(await response!.text()).matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
    expect(served.length).toBeGreaterThan(0);
    for (const tag of served) expect(tag, tag).toContain(`nonce="${nonce}"`);
    await page.waitForLoadState("networkidle");
    const scripts = await page.evaluate(() =>
      [...document.querySelectorAll("script")].map((s) => ({ nonce: s.nonce, src: s.src || "(inline)" })),
    );
    expect(scripts.length).toBeGreaterThan(0);
    // The browser hides the attribute once the policy is applied; the property keeps the value. A
    // chunk the framework's runtime loads later (a streamed segment's code) may come without one:
    // 'strict-dynamic' lets a trusted script load it, but only our own code, never inline script.
    for (const s of scripts) {
      if (s.nonce === nonce) continue;
      expect(s.src, "a script without the nonce").toMatch(
        /^http:\/\/localhost:\d+\/_next\/static\/chunks\/[\w.-]+\.js$/,
      );
    }
    // Next's client runtime ran (it sets window.next once the app router has hydrated).
    await expect.poll(() => page.evaluate(() => Boolean((window as unknown as { next?: unknown }).next))).toBe(true);
  }
  expect(await violations()).toEqual([]);
});

test("markup injected into a page cannot run script: an inline handler without the nonce is refused", async ({
  page,
}) => {
  const violations = await watchViolations(page);
  await page.goto("/");
  await page.waitForLoadState("networkidle");
  await page.evaluate(() => {
    (window as unknown as { __injected?: boolean }).__injected = false;
    const div = document.createElement("div");
    div.innerHTML = '<img alt="" src="/no-such-image.png" onerror="window.__injected = true">';
    document.body.append(div);
  });
  await expect.poll(violations).toContainEqual(expect.stringContaining("script-src"));
  expect(await page.evaluate(() => (window as unknown as { __injected?: boolean }).__injected)).toBe(false);
});
