import type { JudgeRecord } from "../judge";
import type { Rule } from "./types";

/** Wires in a seven-wire strand (ASTM A416). */
export const WIRES_PER_STRAND = 7;

/** The ledger's limit when the project names none: 2 % of the member's prestressing steel. */
export const DEFAULT_WIRE_LOSS_LIMIT_PCT = 2;

/**
 * Wires broken and not replaced on one tendon: for each end, the most any current record of that
 * end reports (a correction replaces its earlier revision; a restress that reports the same broken
 * wire again does not count it twice, nor does one that reports none forget it).
 */
export function unreplacedWires(records: readonly Pick<JudgeRecord, "chainId" | "revision" | "end" | "wireBreaks">[]) {
  const head = new Map<string, number>();
  for (const r of records) head.set(r.chainId, Math.max(head.get(r.chainId) ?? 0, r.revision));
  const perEnd = new Map<string, number>();
  for (const r of records)
    if (r.revision === head.get(r.chainId)) perEnd.set(r.end, Math.max(perEnd.get(r.end) ?? 0, r.wireBreaks));
  return [...perEnd.values()].reduce((s, n) => s + n, 0);
}

/**
 * The member's wire-break ledger: the steel lost to unreplaced broken wires, summed over the
 * member's tendons, against the project's limit (default 2 % of the member's prestressing steel,
 * ACI 318-02 §18.20.4 as quoted in DOMAIN.md; its number in ACI 318-19 is from memory, so the
 * reason names the 2002 clause). A broken wire is counted at one seventh of its strand's area: the
 * centre wire is a little larger than the outer ones (ASTM A416, from memory), so an outer wire
 * counts slightly more than it weighs, on the safe side. Raised on each tendon of the member that
 * has a break of its own, naming the member, since the limit is the member's, not the tendon's.
 */
export const memberWireLoss: Rule = ({ input, judgement }) => {
  const member = input.member;
  if (!member || !(member.steelMm2 > 0)) return null;
  const own = unreplacedWires(input.records);
  if (own === 0) return null;
  const ownWireArea = judgement.strand.areaMm2 / WIRES_PER_STRAND;
  const lostMm2 = own * ownWireArea + member.otherBreaks.reduce((s, b) => s + b.wires * b.wireAreaMm2, 0);
  const lostPct = (lostMm2 / member.steelMm2) * 100;
  const limit = input.project.wireLossLimitPct ?? DEFAULT_WIRE_LOSS_LIMIT_PCT;
  if (lostPct <= limit) return null;
  const wires = own + member.otherBreaks.reduce((s, b) => s + b.wires, 0);
  const tags = [{ tag: input.tendon.tag ?? "this tendon", wires: own }, ...member.otherBreaks]
    .map((b) => `${b.tag} (${b.wires})`)
    .join(", ");
  return {
    kind: "member_wire_loss",
    reason:
      `${member.label} has ${wires} broken wire${wires > 1 ? "s" : ""} not replaced, ${lostPct.toFixed(1)} % of its ` +
      `prestressing steel, over the project's ${limit} % limit (ACI 318-02 §18.20.4): ${tags}.`,
    recordId: input.records.find((r) => r.wireBreaks > 0)?.id ?? null,
  };
};
