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

export function FieldError({ id, messages }: { id: string; messages?: string[] }) {
  if (!messages?.length) return null;
  return (
    <p id={id} className="mt-1 font-semibold text-signal-stop">
      {messages.join(" ")}
    </p>
  );
}
