"use client";

import { useEffect } from "react";
import useSWR from "swr";
import { type FetchError, fetchJson } from "@/lib/client/fetcher";

/**
 * A list a setup screen reads from its route handler through swr. The page hands over what it
 * read on the server (`initial`): that is the first render, and it is written into swr's cache so
 * a screen opened again never shows an older copy. Forms call `mutate(key)` after saving and the
 * list is read again; focus and reconnect read it again too, as swr does by default.
 */
export function useRouteData<T>(key: string, initial: T) {
  const swr = useSWR<T, FetchError>(key, fetchJson<T>, { fallbackData: initial, revalidateOnMount: false });
  const { mutate } = swr;
  useEffect(() => {
    void mutate(initial, { revalidate: false });
  }, [initial, mutate]);
  return { data: swr.data ?? initial, error: swr.error };
}

/** Said when reading a list again failed; the list keeps showing what it had. */
export function RefreshError({ error, what }: { error: FetchError | undefined; what: string }) {
  if (!error) return null;
  return (
    <p role="status" className="mt-2 font-semibold text-signal-stop">
      <span aria-hidden="true">⚠ </span>
      {`The ${what} could not be read again (${error.message}). It shows what was read before; reload the page to try again.`}
    </p>
  );
}
