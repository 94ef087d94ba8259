"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { FieldError, FormMessage } from "@/components/ui/form-message";
import { sendJson } from "@/lib/client/send-json";
import { useApiCall } from "@/lib/client/use-api-call";

/**
 * A statement a person signs for an act that changes a pour (its release, its reopening): the
 * text may be suggested, but it is sent only once its author has ticked that they read it and
 * that it is their own, and then confirmed the act in a second step.
 */
export function SignedStatementForm(props: {
  id: string;
  url: string;
  field: "statement" | "reason";
  label: string;
  suggested: string;
  act: string;
  question: string;
  /** Ask for the signer's typed name and licence number too (a signed release). */
  signed?: boolean;
}) {
  const router = useRouter();
  const { message, fields, busy, call } = useApiCall();
  const [text, setText] = useState(props.suggested);
  const [signerName, setSignerName] = useState("");
  const [licence, setLicence] = useState("");
  const [owned, setOwned] = useState(false);
  const [confirming, setConfirming] = useState(false);
  return (
    <form
      className="mt-3 space-y-3"
      aria-label={props.act}
      onSubmit={async (e) => {
        e.preventDefault();
        if (!confirming) {
          setConfirming(true);
          return;
        }
        const signature = props.signed ? { signerName, licence } : {};
        const result = await call(sendJson("POST", props.url, { [props.field]: text, ...signature, confirmed: owned }));
        setConfirming(false);
        if (result.ok) router.refresh();
      }}
    >
      <FormMessage tone="error">{message?.text}</FormMessage>
      <div>
        <label htmlFor={`${props.id}-text`} className="field-label">
          {props.label}
        </label>
        <textarea
          id={`${props.id}-text`}
          rows={3}
          className="field-input mt-1 py-2"
          value={text}
          onChange={(e) => {
            setText(e.target.value);
            setConfirming(false);
          }}
          aria-describedby={`${props.id}-error`}
        />
        <FieldError id={`${props.id}-error`} messages={fields[props.field]} />
      </div>
      {props.signed && (
        <div className="grid gap-3 sm:grid-cols-2">
          <div>
            <label htmlFor={`${props.id}-signer`} className="field-label">
              Your name, as you sign
            </label>
            <input
              id={`${props.id}-signer`}
              className="field-input mt-1"
              autoComplete="name"
              value={signerName}
              onChange={(e) => {
                setSignerName(e.target.value);
                setConfirming(false);
              }}
              aria-describedby={`${props.id}-signer-error`}
            />
            <FieldError id={`${props.id}-signer-error`} messages={fields.signerName} />
          </div>
          <div>
            <label htmlFor={`${props.id}-licence`} className="field-label">
              Licence number
            </label>
            <input
              id={`${props.id}-licence`}
              className="field-input mt-1"
              value={licence}
              onChange={(e) => {
                setLicence(e.target.value);
                setConfirming(false);
              }}
              aria-describedby={`${props.id}-licence-error`}
            />
            <FieldError id={`${props.id}-licence-error`} messages={fields.licence} />
          </div>
        </div>
      )}
      <label className="flex items-start gap-3 font-semibold">
        <input
          type="checkbox"
          className="mt-1 h-6 w-6 shrink-0"
          checked={owned}
          onChange={(e) => {
            setOwned(e.target.checked);
            setConfirming(false);
          }}
        />
        I have read this statement; it is my own and is recorded under my name.
      </label>
      <FieldError id={`${props.id}-confirmed-error`} messages={fields.confirmed} />
      {confirming ? (
        <div
          role="alertdialog"
          aria-label={`Confirm: ${props.act}`}
          className="space-y-3 rounded-md border-2 border-ink bg-concrete-100 p-3"
        >
          <p className="font-bold">{props.question}</p>
          {!owned && (
            <p className="font-semibold text-signal-stop">Tick the box above first: the statement must be yours.</p>
          )}
          <div className="flex flex-wrap gap-2">
            <button type="submit" className="btn-primary" disabled={busy || !owned}>
              Yes, {props.act.charAt(0).toLowerCase() + props.act.slice(1)}
            </button>
            <button type="button" className="btn-quiet" onClick={() => setConfirming(false)}>
              Back
            </button>
          </div>
        </div>
      ) : (
        <button type="submit" className="btn-primary">
          {props.act}
        </button>
      )}
    </form>
  );
}
