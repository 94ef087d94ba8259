import { wireBreakWords } from "@/lib/schemas/wire-break-words";
import type { Rule } from "./types";

export const wireBreak: Rule = ({ judgement }) => {
  const bad = judgement.ends.filter((e) => e.record.wireBreaks > 0);
  if (!bad.length) return null;
  return {
    kind: "wire_break",
    reason: bad
      .map((e) => {
        const details = e.record.wireBreakDetails?.length
          ? `: ${e.record.wireBreakDetails.map(wireBreakWords).join("; ")}`
          : "";
        return `${e.record.wireBreaks} wire break${e.record.wireBreaks > 1 ? "s" : ""} reported at end ${e.end}${details}.`;
      })
      .join(" "),
    recordId: bad[0]!.record.id,
  };
};
