"use client";
import { SafetyCaution } from "@/components/ui/caution";
import { OutboxWriteError } from "@/lib/offline/outbox";
import { useState } from "react";
import { useField } from "./field-provider";

/**
 * The parts the tablet's follow-up forms share (the lift-off check and the detension): a field's
 * problem tied to its box, and the choice of the equipment set that was on the tendon.
 */

export function Problem({ id, message }: { id: string; message: string | undefined }) {
  if (!message) return null;
  return (
    <p id={id} role="alert" className="mt-1 font-semibold text-signal-stop">
      {message}
    </p>
  );
}

export function SetChoice({
  name,
  sets,
  value,
  onChange,
  errorId,
  error,
}: {
  /** The radio group's name, one per form. */
  name: string;
  sets: { id: string; name: string; gaugeSerial: string }[];
  value: string;
  onChange: (setId: string) => void;
  errorId: string;
  error: string | undefined;
}) {
  return (
    <fieldset aria-describedby={error ? errorId : undefined}>
      <legend className="field-label">Equipment set</legend>
      <div className="mt-1 grid gap-2">
        {sets.length === 0 && <p>No equipment sets were downloaded with this pour.</p>}
        {sets.map((s) => (
          <label
            key={s.id}
            className="flex min-h-touch cursor-pointer items-center gap-3 rounded-md border-2 border-concrete-500 px-3 has-checked:border-ink has-checked:bg-concrete-100"
          >
            <input
              type="radio"
              name={name}
              value={s.id}
              className="h-6 w-6"
              checked={value === s.id}
              onChange={() => onChange(s.id)}
            />
            <span>
              <strong>{s.name}</strong> · gauge {s.gaugeSerial}
            </span>
          </label>
        ))}
      </div>
      <Problem id={errorId} message={error} />
    </fieldset>
  );
}

/** What a follow-up form is opened with: the order it answers, who records it, and how it closes. */
export interface FollowUpOrder<Session> {
  dispositionId: string;
  session: Session;
  onDone: (saved: boolean) => void;
}

/**
 * The frame of a follow-up an engineer ordered, on the hold panel: its heading, what was recorded
 * already, and then either why it cannot be recorded on this tablet yet, the form, or the button
 * that opens the form; a saved one is sent with the next sync.
 */
export interface FollowUpNames {
  /** The follow-up's name, as heading and region label ("Detension"). */
  title: string;
  /** Its name inside a sentence ("the detension"). */
  what: string;
  testId: string;
  openTestId: string;
}

export function FollowUpPanel<Session>(props: {
  names: FollowUpNames;
  /** The engineer's order the follow-up answers, once it is on this tablet in full. */
  dispositionId: string | undefined;
  /** Who is signed in on this tablet. */
  session: Session | undefined;
  /** How many were recorded under this order already (the button then offers "another"). */
  recorded: number;
  /** What was recorded, shown above the rest. */
  children?: React.ReactNode;
  /** The form, shown while open. */
  form: (order: FollowUpOrder<Session>) => React.ReactNode;
}) {
  const { sendSaved } = useField();
  const [open, setOpen] = useState(false);
  const done = (saved: boolean) => {
    setOpen(false);
    if (saved) sendSaved();
  };
  const { title, what, testId, openTestId } = props.names;
  const another = what.replace(/^the /, "another ");
  return (
    <section
      aria-label={title}
      className="grid gap-3 rounded-md border-2 border-ink bg-concrete-50 p-3"
      data-testid={testId}
    >
      <h4 className="text-lead font-bold">{title}</h4>
      {props.children}
      {!props.dispositionId ? (
        <p className="font-semibold">
          Sync with signal once: the engineer&apos;s order must reach this tablet in full.
        </p>
      ) : !props.session ? (
        <p className="font-semibold">Sign in on this tablet to record {what}.</p>
      ) : open ? (
        props.form({ dispositionId: props.dispositionId, session: props.session, onDone: done })
      ) : (
        <button type="button" className="btn-primary w-full" onClick={() => setOpen(true)} data-testid={openTestId}>
          {props.recorded ? `Record ${another}` : `Record ${what}`}
        </button>
      )}
    </section>
  );
}

/** The problem that belongs to no one field, at the head of a follow-up form. */
export function FormProblem({ message }: { message: string | undefined }) {
  if (!message) return null;
  return (
    <p role="alert" className="font-semibold text-signal-stop">
      {message}
    </p>
  );
}

/** The caution and the save and cancel buttons at the foot of a follow-up form. */
export function FollowUpActions(props: { busy: boolean; saveLabel: string; saveTestId: string; onCancel: () => void }) {
  return (
    <>
      <SafetyCaution />
      <div className="flex flex-wrap gap-3">
        <button type="submit" className="btn-primary grow" disabled={props.busy} data-testid={props.saveTestId}>
          {props.busy ? "Saving…" : props.saveLabel}
        </button>
        <button type="button" className="btn-quiet" onClick={props.onCancel}>
          Cancel
        </button>
      </div>
    </>
  );
}

/** What to tell the crew when the tablet could not save a follow-up ("the detension"). */
export function saveFailure(e: unknown, what: string): string {
  return e instanceof OutboxWriteError ? e.message : `The tablet could not save ${what}. Nothing was saved.`;
}
