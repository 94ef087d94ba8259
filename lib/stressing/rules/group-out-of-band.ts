import { showPct } from "@/lib/format/quantities";
import type { Rule } from "./types";

/**
 * The average deviation of a group of tendons outside the project's group band (`groupTolerancePct`;
 * project specifications commonly give ±5 % on a group's average beside ±7 % on each tendon, from
 * memory). The group is the pour. It is judged once every tendon of the group has a complete,
 * non-provisional verdict, this one included, so a group half stressed is never flagged on a partial
 * average. One flag per group: it goes on the tendon stressed last (the one that completed the
 * group), so judging every tendon again raises it once.
 */
export const groupOutOfBand: Rule = ({ input, judgement: j }) => {
  const band = input.project.groupTolerancePct ?? null;
  const group = input.group;
  if (band === null || !(band > 0) || !group) return null;
  if (j.provisional || !j.comparison) return null;
  const others = group.tendons;
  if (others.some((t) => t.deviationPct === null)) return null;
  const mine = Math.max(...j.ends.map((e) => +new Date(e.record.deviceTime)));
  const stressedAfter = others.some((t) => t.lastStressedAt !== null && +new Date(t.lastStressedAt) > mine);
  if (stressedAfter) return null;
  const deviations = [j.comparison.deviationPct, ...others.map((t) => t.deviationPct as number)];
  const average = deviations.reduce((s, d) => s + d, 0) / deviations.length;
  if (Math.abs(average) <= band) return null;
  return {
    kind: "group_out_of_band",
    reason:
      `The ${deviations.length} tendons of ${group.label} average ${showPct(average)} from their predictions, ` +
      `${average > 0 ? "long" : "short"} of the ±${band} % group band (each tendon is also judged on its own band).`,
    recordId: j.ends.at(-1)?.record.id ?? null,
  };
};
