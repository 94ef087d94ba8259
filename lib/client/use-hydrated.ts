import { useSyncExternalStore } from "react";

const noSubscription = () => () => {};

/**
 * False in the server's HTML and during hydration, true once the page's script runs. A page can
 * paint before its script has run; a control changed then would be set back by hydration, and a
 * submit would go the browser's own way, so forms keep their controls disabled until this is true.
 */
export function useHydrated(): boolean {
  return useSyncExternalStore(
    noSubscription,
    () => true,
    () => false,
  );
}
