/** Tautline's mark: a draped tendon pulled straight between two anchors. */
export function BrandMark({ className = "h-8 w-8" }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true" focusable="false">
      <rect x="2" y="9" width="4" height="14" rx="1" fill="currentColor" />
      <rect x="26" y="9" width="4" height="14" rx="1" fill="currentColor" />
      <path
        d="M6 12 Q16 26 26 12"
        fill="none"
        stroke="currentColor"
        strokeWidth="1.5"
        strokeDasharray="2 2"
        opacity="0.55"
      />
      <path d="M6 16 H26" stroke="currentColor" strokeWidth="3" strokeLinecap="round" />
    </svg>
  );
}
