import { spawn } from "node:child_process";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";

// scripts/supervise.sh keeps the app and the dispatcher running under `npm start`.
describe("the process supervisor", () => {
  it("logs a crash, starts the process again, and stops cleanly when told to", async () => {
    const dir = mkdtempSync(join(tmpdir(), "supervise-"));
    const log = join(dir, "worker.log");
    const runs = join(dir, "runs");
    writeFileSync(runs, "");
    // Crashes on its first run; the second run stays up.
    const worker = `echo run >> ${runs}; if [ $(wc -l < ${runs}) -eq 1 ]; then echo boom; exit 3; fi; exec sleep 30`;
    const child = spawn("bash", ["scripts/supervise.sh", "worker", log, "bash", "-c", worker], { stdio: "ignore" });
    const deadline = Date.now() + 10_000;
    while (readFileSync(runs, "utf8").split("\n").filter(Boolean).length < 2 && Date.now() < deadline) {
      await new Promise((r) => setTimeout(r, 100));
    }
    const text = readFileSync(log, "utf8");
    expect(text).toContain("boom");
    expect(text).toMatch(/supervisor: worker exited with code 3; restart 1 in 1s/);
    expect(readFileSync(runs, "utf8").split("\n").filter(Boolean)).toHaveLength(2);

    child.kill("SIGTERM");
    const code = await new Promise<number | null>((r) => child.on("exit", r));
    expect(code).toBe(0);
    // Told to stop, it does not start another run.
    await new Promise((r) => setTimeout(r, 1500));
    expect(readFileSync(runs, "utf8").split("\n").filter(Boolean)).toHaveLength(2);
    expect(readFileSync(log, "utf8").match(/supervisor:/g)).toHaveLength(1);
  });
});
