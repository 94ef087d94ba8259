import type { FlagStatus, Verdict } from "@/lib/schemas/domain";
import { FLAG_STATUS_LABELS, flagLabel } from "@/lib/schemas/flag";
import { showPct } from "@/lib/format/quantities";

export { flagLabel } from "@/lib/schemas/flag";

/** A verdict as an icon, a word and the number: never colour alone. */
const STYLE: Record<Verdict, { cls: string; icon: string; word: string }> = {
  "in band": { cls: "border-signal-band bg-signal-band-bg text-signal-band", icon: "M5 12l4 4 10-10", word: "In band" },
  long: { cls: "border-signal-long bg-signal-long-bg text-signal-long", icon: "M12 19V5M5 12l7-7 7 7", word: "Long" },
  short: {
    cls: "border-signal-short bg-signal-short-bg text-signal-short",
    icon: "M12 5v14M5 12l7 7 7-7",
    word: "Short",
  },
  incomplete: { cls: "border-concrete-500 bg-concrete-100 text-ink", icon: "M6 12h12", word: "Incomplete" },
};

export function VerdictBadge({
  verdict,
  deviationPct,
  provisional,
}: {
  verdict: Verdict;
  deviationPct?: number | null;
  provisional?: boolean;
}) {
  const s = STYLE[verdict];
  return (
    <span
      className={`inline-flex min-h-touch items-center gap-2 whitespace-nowrap rounded-md border-2 px-3 font-bold ${s.cls}`}
      data-verdict={verdict}
    >
      <svg viewBox="0 0 24 24" className="h-5 w-5" aria-hidden="true">
        <path
          d={s.icon}
          fill="none"
          stroke="currentColor"
          strokeWidth="3"
          strokeLinecap="round"
          strokeLinejoin="round"
        />
      </svg>
      <span>{s.word}</span>
      {deviationPct !== null && deviationPct !== undefined && (
        <span className="tabular-nums">{showPct(deviationPct)}</span>
      )}
      {provisional && <span className="text-label font-semibold uppercase">provisional</span>}
    </span>
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
      <svg viewBox="0 0 24 24" className="h-4 w-4" aria-hidden="true">
        {closed ? (
          <path d="M5 12l4 4 10-10" fill="none" stroke="currentColor" strokeWidth="3" />
        ) : (
          <path
            d="M6 3v18M6 4h11l-3 4 3 4H6"
            fill="none"
            stroke="currentColor"
            strokeWidth="2.5"
            strokeLinejoin="round"
          />
        )}
      </svg>
      {flagLabel(kind)} · {FLAG_STATUS_LABELS[status as FlagStatus] ?? status}
    </span>
  );
}
