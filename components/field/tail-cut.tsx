"use client";
import { useState, type ReactNode } from "react";
import { ConfirmDialog } from "@/components/ui/confirm-dialog";
import type { LocalTailCut, SessionMeta } from "@/lib/offline/db";
import { OutboxWriteError, saveTailCuts } from "@/lib/offline/outbox";
import { formatDateTime } from "@/lib/format/dates";
import type { FieldTendon } from "@/lib/schemas/sync";
import type { Clearance } from "@/lib/stressing/tail-clearance";
import { useField } from "./field-provider";

/**
 * Tails cut: a step nobody can take back. Each tendon shows as held (with why) or clear to cut;
 * the crew records the cut once, after a confirmation that says it cannot be undone. A held
 * tendon offers no cut at all.
 */

interface CutTarget {
  projectId: string;
  pourId: string;
  tendons: Pick<FieldTendon, "id" | "tag">[];
}

function useCut(session: SessionMeta, timeZone: string) {
  const { db } = useField();
  const [error, setError] = useState<string | null>(null);
  const cut = async (target: CutTarget) => {
    setError(null);
    try {
      await saveTailCuts(db, {
        projectId: target.projectId,
        pourId: target.pourId,
        tendonIds: target.tendons.map((t) => t.id),
        authorUserId: session.userId,
        authorName: session.name,
      });
      return true;
    } catch (e) {
      setError(
        e instanceof OutboxWriteError
          ? e.message
          : "The tablet could not save the tails cut. Nothing was saved; try again.",
      );
      return false;
    }
  };
  return { cut, error, timeZone };
}

const NO_UNDO =
  "Cutting tails cannot be undone: once the strand tails are cut, the jack can no longer grip the tendon to restress it or check its lift-off.";

/**
 * The button that asks before a cut is recorded, the cut's error, and the question: it says that
 * nothing takes a cut back, then what the caller adds.
 */
function AskThenCut(props: {
  button: string;
  buttonClass: string;
  testId: string;
  error: string | null;
  title: string;
  confirmLabel: string;
  onConfirm: () => void;
  children: ReactNode;
}) {
  const [asking, setAsking] = useState(false);
  return (
    <>
      <button type="button" className={props.buttonClass} onClick={() => setAsking(true)} data-testid={props.testId}>
        {props.button}
      </button>
      {props.error && (
        <p role="alert" className="font-semibold text-signal-stop">
          {props.error}
        </p>
      )}
      <ConfirmDialog
        open={asking}
        title={props.title}
        confirmLabel={props.confirmLabel}
        onCancel={() => setAsking(false)}
        onConfirm={() => {
          setAsking(false);
          props.onConfirm();
        }}
      >
        <p>{NO_UNDO}</p>
        {props.children}
      </ConfirmDialog>
    </>
  );
}

export function TailCutPanel(props: {
  tendon: FieldTendon;
  clearance: Clearance;
  cut: LocalTailCut | undefined;
  session: SessionMeta;
  timeZone: string;
}) {
  const { tendon, clearance, cut } = props;
  const { cut: saveCut, error } = useCut(props.session, props.timeZone);

  if (cut) {
    return (
      <section aria-label="Tails" className="card grid gap-1" data-testid="tail-cut" data-cut="cut">
        <h3 className="text-lead font-bold">Tails cut</h3>
        <p>
          By {cut.cutByName} at {formatDateTime(cut.cutAt, props.timeZone)} ·{" "}
          <span data-testid="tail-cut-sync">
            {cut.syncState === "synced"
              ? "received by the server"
              : cut.syncState === "pending"
                ? "waiting to send"
                : `needs attention (${cut.syncState})`}
          </span>
        </p>
        {cut.heldReasons.length > 0 && (
          <p className="font-semibold text-signal-stop">
            The tendon was held when the cut reached the server; the inspector and the engineer are told:{" "}
            {cut.heldReasons.join(" ")}
          </p>
        )}
      </section>
    );
  }

  if (!clearance.clear) {
    return (
      <section
        aria-label="Tails"
        className="card grid gap-2 border-2 border-signal-stop"
        data-testid="tail-cut"
        data-cut="held"
      >
        <h3 className="text-lead font-bold text-signal-stop">Tails: held, do not cut</h3>
        <ul className="list-disc pl-6" data-testid="tail-held-reasons">
          {clearance.reasons.map((r) => (
            <li key={r}>{r}</li>
          ))}
        </ul>
        <p className="font-bold" data-testid="tail-cut-refused">
          No cut can be recorded on this tablet while the tendon is held.
        </p>
      </section>
    );
  }

  return (
    <section
      aria-label="Tails"
      className="card grid gap-2 border-2 border-signal-band"
      data-testid="tail-cut"
      data-cut="clear"
    >
      <h3 className="text-lead font-bold text-signal-band">Tails: clear to cut</h3>
      <p>Every flag is closed, every end is recorded and the concrete gate is met.</p>
      <AskThenCut
        button="Record tails cut"
        buttonClass="btn-primary w-fit"
        testId="tail-cut-button"
        error={error}
        title={`Record tails cut on ${tendon.tag}?`}
        confirmLabel={`Tails of ${tendon.tag} are cut`}
        onConfirm={() => void saveCut({ projectId: tendon.projectId, pourId: tendon.pourId, tendons: [tendon] })}
      >
        <p>It is recorded as cut by {props.session.name} now, and sent to the server with the next sync.</p>
      </AskThenCut>
    </section>
  );
}

/** One act for every clear, uncut tendon of a pour. */
export function CutAllClear(props: {
  projectId: string;
  pourId: string;
  clear: Pick<FieldTendon, "id" | "tag">[];
  session: SessionMeta;
  timeZone: string;
}) {
  const { cut, error } = useCut(props.session, props.timeZone);
  if (!props.clear.length) return null;
  const tags = props.clear.map((t) => t.tag).join(", ");
  return (
    <div className="grid gap-1">
      <AskThenCut
        button={`Record tails cut on all clear tendons (${props.clear.length})`}
        buttonClass="btn-quiet"
        testId="cut-all-clear"
        error={error}
        title={`Record tails cut on ${props.clear.length} tendon${props.clear.length === 1 ? "" : "s"}?`}
        confirmLabel="These tails are cut"
        onConfirm={() => void cut({ projectId: props.projectId, pourId: props.pourId, tendons: props.clear })}
      >
        <p>Clear tendons: {tags}. Held tendons are left out.</p>
        <p>Recorded as cut by {props.session.name} now.</p>
      </AskThenCut>
    </div>
  );
}
