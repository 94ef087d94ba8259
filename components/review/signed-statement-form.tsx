"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { FormField } from "@/components/ui/form-field";
import { FieldError, FormMessage } from "@/components/ui/form-message";
import { sendJson } from "@/lib/client/send-json";
import { useApiCall } from "@/lib/client/use-api-call";
import { ClientForm } from "@/components/ui/client-form";

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
  const { message, fields, busy, call } = useApiCall([props.field, "signerName", "licence", "confirmed"]);
  const [text, setText] = useState(props.suggested);
  const [signerName, setSignerName] = useState("");
  const [licence, setLicence] = useState("");
  const [owned, setOwned] = useState(false);
  const [confirming, setConfirming] = useState(false);
  return (
    <ClientForm
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
      <FormField
        as="textarea"
        id={`${props.id}-text`}
        label={props.label}
        rows={3}
        value={text}
        onChange={(e) => {
          setText(e.target.value);
          setConfirming(false);
        }}
        error={fields[props.field]}
      />
      {props.signed && (
        <div className="grid gap-3 sm:grid-cols-2">
          <FormField
            id={`${props.id}-signer`}
            label="Your name, as you sign"
            autoComplete="name"
            value={signerName}
            onChange={(e) => {
              setSignerName(e.target.value);
              setConfirming(false);
            }}
            error={fields.signerName}
          />
          <FormField
            id={`${props.id}-licence`}
            label="Licence number"
            value={licence}
            onChange={(e) => {
              setLicence(e.target.value);
              setConfirming(false);
            }}
            error={fields.licence}
          />
        </div>
      )}
      <label className="flex items-start gap-3 font-semibold">
        <input
          type="checkbox"
          className="mt-1 h-6 w-6 shrink-0"
          aria-invalid={fields.confirmed ? true : undefined}
          aria-describedby={fields.confirmed ? `${props.id}-confirmed-error` : undefined}
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
    </ClientForm>
  );
}
