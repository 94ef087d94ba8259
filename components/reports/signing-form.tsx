"use client";

import { useState, type ReactNode } from "react";
import { ClientForm } from "@/components/ui/client-form";
import { ConfirmDialog } from "@/components/ui/confirm-dialog";
import { FormMessage } from "@/components/ui/form-message";
import { sendJson } from "@/lib/client/send-json";
import { useApiCall, type Shown } from "@/lib/client/use-api-call";
import { SignerFields } from "./signer-fields";

/**
 * The inspector's signature of a report, the same for the pour's stressing report and the day's
 * inspection report, in the office and on the tablet: what the report itself asks (`children`,
 * given the messages of a refusal by box), then the typed name, licence or certification number
 * and statement, and one confirmation before the signature is final. The boxes are uncontrolled:
 * the body is read from the form when it is sent (`read` adds the report's own parts), and the
 * server checks everything again and names the field of any fault.
 */
export function SigningForm({
  api,
  shown,
  label,
  className,
  signerId,
  signerName,
  defaultStatement,
  read,
  submitLabel,
  confirmTitle,
  confirmText,
  onSigned,
  children,
}: {
  /** The signatures endpoint. */
  api: string;
  /** The boxes the form shows, as the route names its fields. */
  shown: Shown;
  label: string;
  className: string;
  signerId: (part: string) => string;
  signerName: string;
  defaultStatement: string;
  read?: (data: FormData) => Record<string, unknown>;
  submitLabel: string;
  confirmTitle: string;
  /** What the confirmation says is signed. */
  confirmText: ReactNode;
  onSigned: (revision: number) => void;
  children?: (fields: Record<string, string[]>) => ReactNode;
}) {
  const { message, fields, busy, call } = useApiCall(shown);
  const [pending, setPending] = useState<Record<string, unknown> | null>(null);

  async function sign() {
    const body = pending;
    setPending(null);
    if (!body) return;
    const result = await call(sendJson<{ revision: number }>("POST", api, body));
    if (result.ok) onSigned(result.data.revision);
  }

  return (
    <ClientForm
      className={className}
      aria-label={label}
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        const data = new FormData(e.currentTarget);
        setPending({
          signerName: String(data.get("signerName") ?? ""),
          licence: String(data.get("licence") ?? ""),
          statement: String(data.get("statement") ?? ""),
          ...read?.(data),
        });
      }}
    >
      <FormMessage tone="error">{message?.text}</FormMessage>
      {children?.(fields)}
      <SignerFields id={signerId} signerName={signerName} defaultStatement={defaultStatement} fields={fields} />
      <button type="submit" className="btn-primary min-h-12" disabled={busy}>
        {busy ? "Signing…" : submitLabel}
      </button>
      <ConfirmDialog
        open={pending !== null}
        title={confirmTitle}
        confirmLabel="Sign"
        onConfirm={() => void sign()}
        onCancel={() => setPending(null)}
      >
        {confirmText}
        <p>The signed copy is frozen; a later change needs a new revision and a new signature.</p>
      </ConfirmDialog>
    </ClientForm>
  );
}
