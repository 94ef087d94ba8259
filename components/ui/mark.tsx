/** A line icon on the 24-unit grid, drawn in the text's colour; always beside words, never alone. */
export function LineIcon({ d, className = "h-5 w-5", weight = 3 }: { d: string; className?: string; weight?: number }) {
  return (
    <svg viewBox="0 0 24 24" className={className} aria-hidden="true">
      <path d={d} fill="none" stroke="currentColor" strokeWidth={weight} strokeLinecap="round" strokeLinejoin="round" />
    </svg>
  );
}

/** What a state looks like: the icon's path and the border, background and text colours. */
export interface MarkLook {
  icon: string;
  cls: string;
}

const SIZES = {
  /** A small upper-case label in a list row (a tendon's state, a notice's kind). */
  chip: { box: "gap-1 px-2 text-label uppercase", icon: "h-4 w-4" },
  /** A verdict in a table or a heading. */
  badge: { box: "min-h-touch gap-2 whitespace-nowrap px-3", icon: "h-5 w-5" },
  /** The verdict the crew reads on the tablet at arm's length. */
  lead: { box: "min-h-touch gap-2 px-3 text-lead", icon: "h-6 w-6" },
} as const;

export type MarkSize = keyof typeof SIZES;

/**
 * A state as a bordered word with its icon, so it never rests on colour alone: the one shape of a
 * verdict (components/ui/verdict-badge.tsx), a tendon's state on the pour log and a notice's kind.
 */
export function Mark({
  look,
  size,
  children,
  ...data
}: {
  look: MarkLook;
  size: MarkSize;
  children: React.ReactNode;
} & { [attribute: `data-${string}`]: string | undefined }) {
  const s = SIZES[size];
  return (
    <span className={`inline-flex items-center rounded-md border-2 font-bold ${s.box} ${look.cls}`} {...data}>
      <LineIcon d={look.icon} className={s.icon} />
      {children}
    </span>
  );
}
