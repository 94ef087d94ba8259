/** Prints the results file of `npm run bench` as one table: figure, value, target, holds or not. */
import { readFileSync } from "node:fs";
import type { Figure } from "./harness";

const file = process.argv[2] ?? ".tmp/bench/results.jsonl";
const rows = readFileSync(file, "utf8")
  .split("\n")
  .filter(Boolean)
  .map((line) => JSON.parse(line) as Figure);
const cells = rows.map((r) => [
  r.figure,
  r.value,
  r.target || "–",
  r.holds === null ? "–" : r.holds ? "holds" : "DOES NOT HOLD",
]);
const head = ["figure", "measured", "target", "holds"];
const widths = head.map((h, i) => Math.max(h.length, ...cells.map((c) => c[i]!.length)));
const line = (c: string[]) => `| ${c.map((x, i) => x.padEnd(widths[i]!)).join(" | ")} |`;
console.log(line(head));
console.log(`| ${widths.map((w) => "-".repeat(w)).join(" | ")} |`);
cells.forEach((c) => console.log(line(c)));
const misses = rows.filter((r) => r.holds === false).length;
console.log(
  `\n${rows.length} figures, ${misses} target${misses === 1 ? "" : "s"} missed, measured ${new Date().toISOString()} on ${process.env.HOSTNAME ?? "this machine"}`,
);
