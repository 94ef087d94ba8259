import type { WireBreak } from "./record";

// No zod here: the tablet's judge (lib/stressing/rules) names wire breaks without loading the
// schemas' validation code; lib/schemas/record.ts re-exports these.

/** Where along the tendon a wire broke, as the crew saw it. */
export const WIRE_BREAK_PLACES = ["jack_end", "far_end", "along_length", "not_known"] as const;
export type WireBreakPlace = (typeof WIRE_BREAK_PLACES)[number];
export const WIRE_BREAK_PLACE_WORDS: Record<WireBreakPlace, string> = {
  jack_end: "at the jack",
  far_end: "at the far end",
  along_length: "along the length",
  not_known: "place not known",
};

/** "strand 3, at the jack" / "strand not known, along the length". */
export function wireBreakWords(b: WireBreak): string {
  return `${b.strand === null ? "strand not known" : `strand ${b.strand}`}, ${WIRE_BREAK_PLACE_WORDS[b.where]}`;
}
