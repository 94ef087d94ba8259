"use client";
import { useSyncExternalStore } from "react";

/** Whether a record form on the page holds typed values not yet saved (the update prompt waits for it). */
let dirty = false;
const listeners = new Set<() => void>();

export function setFormDirty(value: boolean): void {
  if (dirty === value) return;
  dirty = value;
  for (const l of listeners) l();
}

export function useFormDirty(): boolean {
  return useSyncExternalStore(
    (l) => {
      listeners.add(l);
      return () => listeners.delete(l);
    },
    () => dirty,
    () => false,
  );
}
