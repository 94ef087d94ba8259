"use client";
import { useState } from "react";
import { formatDateTime, projectTimeZone } from "@/lib/format/dates";
import { readMeta, type LocalNotice, type SessionMeta } from "@/lib/offline/db";
import type { NoticeKind } from "@/lib/offline/decision-notices";
import { acknowledgeNotices, openNotices } from "@/lib/offline/notices";
import { LineIcon, Mark } from "@/components/ui/mark";
import { useField } from "./field-provider";
import { useLiveQuery as useLive } from "dexie-react-hooks";

const KIND_LOOK: Record<NoticeKind, { word: string; icon: string }> = {
  flag: { word: "New flag", icon: "M6 3v18M6 4h11l-3 4 3 4H6" },
  decision: { word: "Engineer's decision", icon: "M4 20h16M6 16l9-9 3 3-9 9H6z" },
  released: { word: "Pour released", icon: "M5 12l4 4 10-10" },
  reopened: { word: "Pour reopened", icon: "M4 12a8 8 0 1 0 3-6.2M4 4v5h5" },
};

/**
 * What the last syncs brought that the crew must know: new flags, the engineer's decisions with
 * the instruction in the engineer's words, a release or a reopening, one card per change with the
 * tendon's tag and what to do. Kept on the tablet (lib/offline/notices.ts) until someone taps
 * "Read", so a reload or a closed tab does not lose it. Shows the notices of one pour, or of every
 * pour when no pour is given.
 */
export function DecisionNotices({ pourId, className = "" }: { pourId?: string; className?: string }) {
  const { db } = useField();
  const data = useLive(async () => {
    const [notices, session, pours, projects] = await Promise.all([
      openNotices(db, pourId),
      readMeta<SessionMeta>(db, "session"),
      db.pours.toArray(),
      db.projects.toArray(),
    ]);
    const zoneOf = new Map(
      pours.map((p) => {
        const project = projects.find((pr) => pr.id === p.projectId);
        return [p.id, project ? projectTimeZone(project) : "UTC"];
      }),
    );
    return { notices, session, zoneOf };
  }, [db, pourId]);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);

  if (!data || !data.notices.length) return null;
  const { notices, session, zoneOf } = data;
  const manyPours = new Set(notices.map((n) => n.pourId)).size > 1 || !pourId;

  async function acknowledge(shown: LocalNotice[]) {
    setBusy(true);
    setError(null);
    try {
      await acknowledgeNotices(
        db,
        shown.map((n) => n.id),
        session?.name ?? "the crew on this tablet",
      );
    } catch (e) {
      setError(`This tablet could not keep that you read them: ${(e as Error).message}. Try again.`);
    } finally {
      setBusy(false);
    }
  }

  return (
    <section
      aria-labelledby="notices-heading"
      className={`grid gap-3 rounded-md border-4 border-ink bg-concrete-50 p-4 ${className}`}
      data-testid="decision-notices"
    >
      <div role="alert">
        <h2 id="notices-heading" className="flex items-center gap-2 text-lead font-bold">
          <LineIcon
            d="M12 3a6 6 0 0 0-6 6v4l-2 3h16l-2-3V9a6 6 0 0 0-6-6zM10 19a2 2 0 0 0 4 0"
            className="h-7 w-7 shrink-0"
            weight={2.5}
          />
          {notices.length === 1 ? "1 change came with the sync" : `${notices.length} changes came with the sync`}
        </h2>
      </div>
      <ul className="grid gap-3">
        {notices.map((n) => {
          const look = KIND_LOOK[n.kind];
          const holds = n.holds;
          return (
            <li
              key={n.id}
              className={`grid gap-1 rounded-md border-2 bg-white p-3 ${holds ? "border-signal-stop" : "border-ink"}`}
              data-testid="decision-notice"
              data-kind={n.kind}
            >
              <p className="flex flex-wrap items-center gap-x-3 gap-y-1">
                {n.tendonId ? (
                  <a
                    href={`/field/pour?id=${n.pourId}&tendon=${n.tendonId}`}
                    className="inline-flex min-h-touch items-center text-figure font-bold"
                    data-testid="notice-subject"
                    aria-label={`Open tendon ${n.tendonTag}`}
                  >
                    {n.tendonTag}
                  </a>
                ) : (
                  <span className="text-figure font-bold" data-testid="notice-subject">
                    {n.pourName}
                  </span>
                )}
                <Mark
                  look={{ icon: look.icon, cls: holds ? "border-signal-stop text-signal-stop" : "border-ink" }}
                  size="chip"
                >
                  {look.word}
                </Mark>
                {manyPours && n.tendonTag && <span className="text-ink-soft">{n.pourName}</span>}
              </p>
              <p className="font-semibold" data-testid="notice-what">
                {n.what}
              </p>
              {n.words && (
                <p data-testid="notice-words">
                  {n.kind === "flag" ? "Why: " : n.by ? `${n.by}: ` : ""}
                  <q>{n.words}</q>
                  {n.at && (
                    <span className="text-ink-soft"> · {formatDateTime(n.at, zoneOf.get(n.pourId) ?? "UTC")}</span>
                  )}
                </p>
              )}
              <p className="font-bold" data-testid="notice-instruction">
                What to do: {n.instruction}
              </p>
            </li>
          );
        })}
      </ul>
      {error && (
        <p role="alert" className="font-semibold text-signal-stop">
          {error}
        </p>
      )}
      <button
        type="button"
        className="btn-primary min-h-16 w-full text-lead"
        disabled={busy}
        onClick={() => void acknowledge(notices)}
        data-testid="acknowledge-notices"
      >
        {busy
          ? "Keeping that you read them…"
          : notices.length === 1
            ? "Read: hide this notice"
            : `Read: hide these ${notices.length} notices`}
      </button>
      <p className="text-label text-ink-soft">
        Hiding a notice changes nothing on the tendon: the hold and the instruction stay on its panel.
      </p>
    </section>
  );
}
