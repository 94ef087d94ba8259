"use client";

import { useEffect } from "react";

/**
 * What a page shows when it fails: nothing is lost, try again, and a reference to pass on.
 * `inMain` as for the other segment states: the layout already holds the page's <main>.
 */
export function SegmentError({
  what,
  error,
  reset,
  inMain = false,
}: {
  what: string;
  error: Error & { digest?: string };
  reset: () => void;
  inMain?: boolean;
}) {
  const Wrapper = inMain ? "div" : "main";
  useEffect(() => {
    console.error(error);
  }, [error]);
  return (
    <Wrapper className="max-w-2xl space-y-4">
      <p className="field-label">Something went wrong</p>
      <h1 className="text-figure font-bold">{what} could not be shown.</h1>
      <p className="text-ink-soft">
        The records themselves are safe: nothing on this page was changed. Try again in a moment; if it keeps failing,
        tell your project admin
        {error.digest ? ` the reference ${error.digest}` : ""}.
      </p>
      <button type="button" className="btn-primary" onClick={reset}>
        Try again
      </button>
    </Wrapper>
  );
}
