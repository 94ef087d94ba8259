/**
 * The caution that stands beside every verdict, disposition and report. Wording is Tautline's own.
 */
export const CAUTION_TEXT =
  "These figures support the licensed engineer of record; they do not replace the engineer's judgment. " +
  "Local codes, the project specifications and the engineer's instructions govern. " +
  "Stressing is dangerous work: nobody stands behind or over the jack while it is under pressure.";

export function Caution({ className = "" }: { className?: string }) {
  return (
    <aside
      role="note"
      aria-label="Caution"
      className={`flex gap-3 rounded-md border-2 border-ink bg-concrete-100 p-4 text-body ${className}`}
    >
      <svg viewBox="0 0 24 24" className="mt-1 h-6 w-6 shrink-0" aria-hidden="true">
        <path d="M12 2 L23 21 H1 Z" fill="none" stroke="currentColor" strokeWidth="2" strokeLinejoin="round" />
        <path d="M12 9 V14 M12 17 V18" stroke="currentColor" strokeWidth="2.5" strokeLinecap="round" />
      </svg>
      <p>
        <strong>Caution.</strong> {CAUTION_TEXT}
      </p>
    </aside>
  );
}
