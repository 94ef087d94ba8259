"use client";

import { useEffect } from "react";

export default function ErrorPage({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  useEffect(() => {
    console.error(error);
  }, [error]);

  return (
    <main className="mx-auto max-w-xl px-6 py-20">
      <p className="field-label">Something went wrong</p>
      <h1 className="mt-2 text-figure font-bold">This page could not be shown.</h1>
      <p className="mt-4 text-ink-soft">
        Nothing you entered on the tablet is lost: records wait on the device until the server confirms them. Try again,
        and if it keeps happening, tell your project admin{error.digest ? ` the reference ${error.digest}` : ""}.
      </p>
      <button type="button" onClick={reset} className="btn-primary mt-8">
        Try again
      </button>
    </main>
  );
}
