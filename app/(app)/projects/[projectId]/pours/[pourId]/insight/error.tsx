"use client";

export default function InsightError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <main className="space-y-4">
      <h1 className="text-figure font-bold">The pour&apos;s insight could not be shown.</h1>
      <p>
        The records themselves are safe; only this page failed to work them out. Try again in a moment, and tell your
        project admin if it keeps failing.
      </p>
      <button type="button" className="btn-primary" onClick={reset}>
        Try again
      </button>
    </main>
  );
}
