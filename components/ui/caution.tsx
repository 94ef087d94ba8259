import { CAUTION_TEXT, STRESSING_SAFETY_CAUTION } from "@/lib/cautions";

/**
 * The caution that stands beside every verdict, disposition and report; the words live in
 * lib/cautions.ts, the one wording used on screens, e-mails and reports.
 */
export { CAUTION_TEXT };

function Sign({ className }: { className: string }) {
  return (
    <svg viewBox="0 0 24 24" className={className} aria-hidden="true">
      <path d="M12 2 L23 21 H1 Z" fill="none" stroke="currentColor" strokeWidth="2" strokeLinejoin="round" />
      <path d="M12 9 V14 M12 17 V18" stroke="currentColor" strokeWidth="2.5" strokeLinecap="round" />
    </svg>
  );
}

export function Caution({ className = "" }: { className?: string }) {
  return (
    <aside
      role="note"
      aria-label="Caution"
      className={`flex gap-3 rounded-md border-2 border-ink bg-concrete-100 p-4 text-body ${className}`}
    >
      <Sign className="mt-1 h-6 w-6 shrink-0" />
      <p>
        <strong>Caution.</strong> {CAUTION_TEXT}
      </p>
    </aside>
  );
}

/** The stressing safety caution alone, compact, where the jack is pulled (the record form, beside Save). */
export function SafetyCaution({ className = "" }: { className?: string }) {
  return (
    <aside
      role="note"
      aria-label="Safety caution"
      className={`flex gap-2 rounded-md border-2 border-ink bg-concrete-100 px-3 py-2 text-sm leading-snug ${className}`}
    >
      <Sign className="mt-0.5 h-5 w-5 shrink-0" />
      <p>
        <strong>Safety.</strong> {STRESSING_SAFETY_CAUTION}
      </p>
    </aside>
  );
}
