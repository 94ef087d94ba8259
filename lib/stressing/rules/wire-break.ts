import type { Rule } from "./types";

export const wireBreak: Rule = ({ judgement }) => {
  const bad = judgement.ends.filter((e) => e.record.wireBreaks > 0);
  if (!bad.length) return null;
  return {
    kind: "wire_break",
    reason: bad
      .map((e) => `${e.record.wireBreaks} wire break${e.record.wireBreaks > 1 ? "s" : ""} reported at end ${e.end}.`)
      .join(" "),
    recordId: bad[0]!.record.id,
  };
};
