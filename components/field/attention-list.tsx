"use client";
import { requeue } from "@/lib/offline/outbox";
import { useField } from "./field-provider";
import { useLiveQuery as useLive } from "dexie-react-hooks";

/** Operations the server refused, with its reason, kept until a person deals with them. */
export function AttentionList() {
  const { db } = useField();
  const items = useLive(async () => {
    const entries = await db.outbox.where("state").equals("attention").toArray();
    return Promise.all(entries.map(async (e) => ({ entry: e, tendon: await db.tendons.get(e.payload.tendonId) })));
  }, [db]);
  if (!items?.length) return null;
  return (
    <section id="needs-attention" aria-labelledby="attention-heading" className="card border-2 border-signal-stop">
      <h2 id="attention-heading" className="text-lead font-bold text-signal-stop">
        Needs attention ({items.length})
      </h2>
      <p className="mt-1">The server did not take these records. They stay on this tablet; nothing is lost.</p>
      <ul className="mt-3 grid gap-3">
        {items.map(({ entry, tendon }) => (
          <li key={entry.opId} className="rounded-md border border-concrete-300 p-3" data-testid="attention-item">
            <p className="font-bold">
              {tendon?.tag ?? "Tendon"} ·{" "}
              {entry.kind === "detension"
                ? "detension"
                : entry.kind === "liftoff_check" && "checkedAt" in entry.payload
                  ? `end ${entry.payload.tendonEnd} · lift-off check`
                  : "revision" in entry.payload
                    ? `end ${entry.payload.tendonEnd} · revision ${entry.payload.revision}`
                    : "tails cut"}{" "}
              — {entry.status === "conflict" ? "changed elsewhere first" : "refused"}
            </p>
            <p className="mt-1">{entry.error?.message}</p>
            {entry.error?.fields && (
              <ul className="mt-1 list-disc pl-6">
                {Object.entries(entry.error.fields).map(([field, messages]) => (
                  <li key={field}>
                    {field}: {messages.join("; ")}
                  </li>
                ))}
              </ul>
            )}
            <button type="button" className="btn-quiet mt-2" onClick={() => void requeue(db, entry.opId)}>
              Send again
            </button>
          </li>
        ))}
      </ul>
    </section>
  );
}
