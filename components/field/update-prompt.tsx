"use client";
import { useEffect, useRef, useState } from "react";
import type { Workbox } from "workbox-window";
import { useFieldIfOpen } from "./field-provider";
import { useFormDirty } from "./form-dirty";

/**
 * Registers the offline worker (production builds only) and, when a new version is waiting,
 * offers to switch. The switch is allowed only with no form half-filled and nothing waiting to
 * be sent, so an update never interrupts a reading or strands an op.
 */
export function UpdatePrompt() {
  const status = useFieldIfOpen()?.outbox;
  const dirty = useFormDirty();
  const [waiting, setWaiting] = useState(false);
  const wb = useRef<Workbox | null>(null);

  useEffect(() => {
    if (process.env.NODE_ENV !== "production" || !("serviceWorker" in navigator)) return;
    let cancelled = false;
    void import("workbox-window").then(({ Workbox }) => {
      if (cancelled) return;
      const workbox = new Workbox("/sw.js", { scope: "/" });
      workbox.addEventListener("waiting", () => setWaiting(true));
      // The first install takes control quietly; a switch to a new version reloads onto it.
      workbox.addEventListener("controlling", (event) => event.isUpdate && window.location.reload());
      wb.current = workbox;
      void workbox.register();
    });
    return () => {
      cancelled = true;
    };
  }, []);

  if (!waiting) return null;
  const busy = dirty || (status?.pending ?? 1) > 0;
  return (
    <div
      role="status"
      className="flex flex-wrap items-center gap-3 border-b-2 border-ink bg-concrete-100 px-4 py-2"
      data-testid="update-ready"
    >
      <strong>A new version of the field log is ready.</strong>
      {busy ? (
        <span>It switches over once the form is saved or cleared and everything is sent.</span>
      ) : (
        <button type="button" className="btn-primary" onClick={() => wb.current?.messageSkipWaiting()}>
          Update now
        </button>
      )}
    </div>
  );
}
