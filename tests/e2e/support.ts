import type { Page } from "@playwright/test";
import path from "node:path";

/** Screenshots land in test-results/screens/ so people (and the README) can look at them. */
export async function screenshot(page: Page, name: string): Promise<string> {
  const file = path.join("test-results", "screens", `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

const LOCAL_HOSTS = new Set(["localhost", "127.0.0.1", "[::1]"]);

/** Records every request the page makes to a host other than this machine. */
export function watchForeignRequests(page: Page): string[] {
  const foreign: string[] = [];
  page.on("request", (request) => {
    const url = new URL(request.url());
    if (url.protocol === "data:" || url.protocol === "blob:") return;
    if (!LOCAL_HOSTS.has(url.hostname)) foreign.push(request.url());
  });
  return foreign;
}
