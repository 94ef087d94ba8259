import type { FlagStatus, Verdict } from "@/lib/schemas/domain";
import { FLAG_STATUS_LABELS, flagLabel } from "@/lib/schemas/flag";
import { showPct } from "@/lib/format/quantities";
import { LineIcon, Mark, type MarkLook, type MarkSize } from "./mark";

export { flagLabel } from "@/lib/schemas/flag";

/** A verdict as an icon, a word and the number: never colour alone. */
export const VERDICT_LOOK: Record<Verdict, MarkLook & { word: string }> = {
  "in band": { cls: "border-signal-band bg-signal-band-bg text-signal-band", icon: "M5 12l4 4 10-10", word: "In band" },
  long: { cls: "border-signal-long bg-signal-long-bg text-signal-long", icon: "M12 19V5M5 12l7-7 7 7", word: "Long" },
  short: {
    cls: "border-signal-short bg-signal-short-bg text-signal-short",
    icon: "M12 5v14M5 12l7 7 7-7",
    word: "Short",
  },
  incomplete: { cls: "border-concrete-500 bg-concrete-100 text-ink", icon: "M6 12h12", word: "Incomplete" },
};

/** An elongation in band on a tendon something else holds: never green. */
const HELD: MarkLook = { icon: "M12 5v9M12 19h.01", cls: "border-signal-stop bg-signal-stop-bg text-signal-stop" };

/**
 * The one way a verdict is shown, in the office (`badge`) and on the tablet (`lead`). `children`
 * stand after the word (the tablet's deviation with its own test id).
 */
export function VerdictBadge({
  verdict,
  deviationPct,
  provisional,
  held = false,
  size = "badge",
  children,
}: {
  verdict: Verdict;
  deviationPct?: number | null;
  provisional?: boolean;
  /** A flag holds the tendon although its elongation is in band: the mark is not the green one. */
  held?: boolean;
  size?: Extract<MarkSize, "badge" | "lead">;
  children?: React.ReactNode;
}) {
  const heldInBand = held && verdict === "in band";
  const look = heldInBand ? { ...VERDICT_LOOK[verdict], ...HELD } : VERDICT_LOOK[verdict];
  return (
    <Mark look={look} size={size} data-verdict={verdict} data-held={heldInBand ? "true" : undefined}>
      <span>{look.word}</span>
      {deviationPct !== null && deviationPct !== undefined && (
        <span className="tabular-nums">{showPct(deviationPct)}</span>
      )}
      {children}
      {provisional && <span className="text-label font-semibold uppercase">provisional</span>}
      {heldInBand && <span>· held</span>}
    </Mark>
  );
}

export function FlagChip({ kind, status }: { kind: string; status: string }) {
  const closed = status === "closed";
  return (
    <span
      className={`inline-flex min-h-8 items-center gap-2 rounded-md border-2 px-2 text-label font-bold uppercase ${
        closed ? "border-concrete-500 text-ink-faint" : "border-signal-stop bg-signal-stop-bg text-signal-stop"
      }`}
    >
      <LineIcon
        d={closed ? "M5 12l4 4 10-10" : "M6 3v18M6 4h11l-3 4 3 4H6"}
        className="h-4 w-4"
        weight={closed ? 3 : 2.5}
      />
      {flagLabel(kind)} · {FLAG_STATUS_LABELS[status as FlagStatus] ?? status}
    </span>
  );
}
