"use client";

import { useState } from "react";
import { ConfirmDialog } from "@/components/ui/confirm-dialog";
import { SignerFields } from "./signer-fields";
import { FormMessage } from "@/components/ui/form-message";
import { sendJson } from "@/lib/client/send-json";
import { useApiCall } from "@/lib/client/use-api-call";

/**
 * The inspector's signature of a pour's stressing report, the same in the office and on the
 * tablet: typed name, licence or certification number and statement, then one confirmation before
 * the signature is final. The server checks everything again and names the field of any fault.
 */
export function PourSignForm({
  api,
  pourName,
  nextRevision,
  signerName,
  defaultStatement,
  onSigned,
  idPrefix = "sign",
}: {
  /** The pour's signatures endpoint. */
  api: string;
  pourName: string;
  nextRevision: number;
  signerName: string;
  defaultStatement: string;
  onSigned: (revision: number) => void;
  idPrefix?: string;
}) {
  const { message, fields, busy, call } = useApiCall(["signerName", "licence", "statement"]);
  const [pending, setPending] = useState<Record<string, string> | null>(null);
  const id = (name: string) => `${idPrefix}-${name}`;

  async function sign() {
    const body = pending;
    setPending(null);
    if (!body) return;
    const result = await call(sendJson<{ revision: number }>("POST", api, body));
    if (result.ok) onSigned(result.data.revision);
  }

  return (
    <form
      className="space-y-3"
      aria-label={`Sign the stressing report of ${pourName}`}
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        const data = new FormData(e.currentTarget);
        setPending({
          signerName: String(data.get("signerName") ?? ""),
          licence: String(data.get("licence") ?? ""),
          statement: String(data.get("statement") ?? ""),
        });
      }}
    >
      <FormMessage tone="error">{message?.text}</FormMessage>
      <SignerFields id={id} signerName={signerName} defaultStatement={defaultStatement} fields={fields} />
      <button type="submit" className="btn-primary min-h-12" disabled={busy}>
        {busy ? "Signing…" : `Sign revision ${nextRevision}`}
      </button>
      <ConfirmDialog
        open={pending !== null}
        title={`Sign revision ${nextRevision} of the stressing report of ${pourName}?`}
        confirmLabel="Sign"
        onConfirm={() => void sign()}
        onCancel={() => setPending(null)}
      >
        <p>Your typed name, licence and statement sign the report as it stands now.</p>
        <p>The signed copy is frozen; a later change needs a new revision and a new signature.</p>
      </ConfirmDialog>
    </form>
  );
}
