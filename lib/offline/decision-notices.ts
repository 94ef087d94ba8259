import { flagLabel } from "@/lib/schemas/flag";
import type { FieldDisposition, FieldFlag, FieldPour, FieldTendon } from "@/lib/schemas/sync";
import { DECISION_INSTRUCTIONS, DECISION_WORDS, WAITING_INSTRUCTION, isOpen } from "./hold-view";

/**
 * What a sync brought that the crew must be told of: a new flag on a tendon, a new decision of
 * the engineer (with the instruction in the engineer's words), a pour released or reopened.
 * Pure: it compares what the tablet held before a pull with what the pull carries. Pours the
 * tablet did not hold before (a first download) bring no notice: the crew opens them fresh.
 */

export type NoticeKind = "flag" | "decision" | "released" | "reopened";

export interface DecisionNotice {
  /** The same change always gets the same id, so a row the server sends twice makes one notice. */
  id: string;
  kind: NoticeKind;
  pourId: string;
  pourName: string;
  tendonId: string | null;
  /** Null for a notice about the whole pour. */
  tendonTag: string | null;
  /** What happened, in words. */
  what: string;
  /** The engineer's own words (instruction, release statement, reopening reason), when there are some. */
  words: string | null;
  /** Who decided, when someone did. */
  by: string | null;
  /** What the crew is to do now. */
  instruction: string;
  /** The change holds the tendon (a new flag, an order of work), as opposed to news that lifts or ends something. */
  holds: boolean;
  /** When it happened on the server (the flag's, decision's, release's or reopening's time). */
  at: string;
}

export type PourState = Pick<FieldPour, "id" | "name"> & Partial<Pick<FieldPour, "release" | "reopened">>;

export interface NoticeDiffInput {
  /** The pours the tablet held before the pull, by id. */
  before: { pours: Map<string, PourState>; flags: Map<string, FieldFlag> };
  /** What the pull carries. */
  arrived: { pours: PourState[]; flags: FieldFlag[] };
  /** Every tendon the tablet knows after the pull, by id (to name a flag's tendon and pour). */
  tendons: Map<string, Pick<FieldTendon, "id" | "tag" | "pourId">>;
}

export const RELEASED_INSTRUCTION =
  "Record nothing more on this pour. Tails may be cut only on tendons shown clear to cut. If more work is needed, the engineer of record must reopen the pour first.";
export const REOPENED_INSTRUCTION =
  "The pour takes records again. Do the work the engineer's reason names, then sync so the engineer can release it again.";

const dispositionKey = (d: FieldDisposition) => `${d.createdAt}|${d.decision}`;
/** "by P. Raman, P.E." ends its sentence with its own full stop. */
const endSentence = (s: string) => (/[.!?]$/.test(s) ? s : `${s}.`);

/** The notices a pull brings, pour notices first, then by tendon tag and time. */
export function noticesFromPull({ before, arrived, tendons }: NoticeDiffInput): DecisionNotice[] {
  const notices: DecisionNotice[] = [];
  const pourName = (id: string) =>
    arrived.pours.find((p) => p.id === id)?.name ?? before.pours.get(id)?.name ?? "this pour";

  for (const pour of arrived.pours) {
    const was = before.pours.get(pour.id);
    if (!was) continue;
    if (pour.release && pour.release.at !== was.release?.at) {
      notices.push({
        id: `released:${pour.id}:${pour.release.at}`,
        kind: "released",
        pourId: pour.id,
        pourName: pour.name,
        tendonId: null,
        tendonTag: null,
        what: endSentence(`Pour released by ${pour.release.by}`),
        words: pour.release.statement,
        by: pour.release.by,
        instruction: RELEASED_INSTRUCTION,
        holds: false,
        at: pour.release.at,
      });
    }
    if (!pour.release && pour.reopened && pour.reopened.at !== was.reopened?.at) {
      notices.push({
        id: `reopened:${pour.id}:${pour.reopened.at}`,
        kind: "reopened",
        pourId: pour.id,
        pourName: pour.name,
        tendonId: null,
        tendonTag: null,
        what: endSentence(`Pour reopened by ${pour.reopened.by}`),
        words: pour.reopened.reason,
        by: pour.reopened.by,
        instruction: REOPENED_INSTRUCTION,
        holds: false,
        at: pour.reopened.at,
      });
    }
  }

  for (const flag of arrived.flags) {
    const tendon = tendons.get(flag.tendonId);
    if (!tendon || !before.pours.has(tendon.pourId)) continue;
    const was = before.flags.get(flag.id);
    const base = {
      pourId: tendon.pourId,
      pourName: pourName(tendon.pourId),
      tendonId: tendon.id,
      tendonTag: tendon.tag,
    };
    const label = flagLabel(flag.kind);
    const known = new Set((was?.dispositions ?? []).map(dispositionKey));
    const fresh = (flag.dispositions ?? []).filter((d) => !known.has(dispositionKey(d)));
    if (!was && isOpen(flag) && !fresh.length) {
      notices.push({
        ...base,
        id: `flag:${flag.id}`,
        kind: "flag",
        what: `New flag: ${label}.`,
        words: flag.reason ?? null,
        by: null,
        instruction: `Held. ${WAITING_INSTRUCTION}`,
        holds: true,
        at: flag.createdAt ?? "",
      });
    }
    for (const d of fresh) {
      notices.push({
        ...base,
        id: `decision:${flag.id}:${d.createdAt}:${d.decision}`,
        kind: "decision",
        what: `Engineer's decision on the ${label.toLowerCase()} flag: ${DECISION_WORDS[d.decision]}.`,
        words: d.reasons,
        by: d.engineerName,
        instruction: DECISION_INSTRUCTIONS[d.decision],
        holds: d.decision !== "accept",
        at: d.createdAt,
      });
    }
  }

  const order = (n: DecisionNotice) => (n.tendonTag === null ? "" : n.tendonTag);
  return notices.sort(
    (a, b) => a.pourName.localeCompare(b.pourName) || order(a).localeCompare(order(b)) || a.at.localeCompare(b.at),
  );
}
