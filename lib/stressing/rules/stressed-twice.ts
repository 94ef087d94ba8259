import { chainsByEnd, type JudgeInput, type JudgeRecord } from "../judge";
import type { Rule } from "./types";

const RESTRESS_DECISIONS = ["restress", "detension_restress"];

/**
 * The restress order a record answers: the one it names, else the last ordered before it reached
 * the server (a stressing after an engineer ordered a restress answers that order).
 */
export function answeredOrder(input: JudgeInput, r: JudgeRecord): string | null {
  if (r.restressOfDispositionId) return r.restressOfDispositionId;
  if (!r.receivedAt) return null;
  const at = +new Date(r.receivedAt);
  return (
    (input.dispositions ?? [])
      .filter((d) => RESTRESS_DECISIONS.includes(d.decision) && +new Date(d.createdAt) < at)
      .sort((a, b) => +new Date(a.createdAt) - +new Date(b.createdAt))
      .at(-1)?.id ?? null
  );
}

/** An end stressed more than once without an engineer's restress order. */
export const stressedTwice: Rule = ({ input }) => {
  const by = chainsByEnd(input.records);
  for (const end of ["A", "B"] as const) {
    const chains = by[end];
    const latest = chains.at(-1);
    if (chains.length > 1 && latest && !answeredOrder(input, latest)) {
      return {
        kind: "stressed_twice",
        reason: `End ${end} was stressed ${chains.length} times and the last stressing is not linked to an engineer's disposition.`,
        recordId: latest.id,
      };
    }
  }
  return null;
};
