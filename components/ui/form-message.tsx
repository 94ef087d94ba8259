/** A message under a form, read out by screen readers when it changes. */
export function FormMessage({ tone, children }: { tone: "error" | "info"; children: React.ReactNode }) {
  if (!children) return null;
  return (
    <p
      role={tone === "error" ? "alert" : "status"}
      className={
        tone === "error"
          ? "rounded-md border-2 border-signal-stop bg-signal-stop-bg p-3 font-semibold text-signal-stop"
          : "rounded-md border-2 border-ink bg-concrete-100 p-3"
      }
    >
      {children}
    </p>
  );
}

/** A field's messages under it; `alert` also reads them out as they appear (the tablet's forms). */
export function FieldError({ id, messages, alert }: { id: string; messages?: string[]; alert?: boolean }) {
  if (!messages?.length) return null;
  return (
    <p id={id} role={alert ? "alert" : undefined} className="mt-1 font-semibold text-signal-stop">
      {messages.join(" ")}
    </p>
  );
}
