"use client";

import { useRouter } from "next/navigation";
import { FieldError, FormMessage } from "@/components/ui/form-message";
import { sendJson } from "@/lib/client/send-json";
import { useApiCall } from "@/lib/client/use-api-call";
import { SignedRevisions } from "./signed-revisions";

export interface SignedRevisionView {
  revision: number;
  signerName: string;
  licence: string;
  signedAt: string;
  fileSha256: string;
  changes: string[];
}

/**
 * The pour's signed stressing reports and, for the inspector, the form that signs the report as it
 * stands. Times come preformatted from the server (lib/format/dates).
 */
export function ReportSigning({
  projectId,
  pourId,
  pourName,
  revisions,
  current,
  canSign,
  signerName,
  defaultStatement,
}: {
  projectId: string;
  pourId: string;
  pourName: string;
  revisions: SignedRevisionView[];
  current: { signed: boolean; changesSinceSigned: string[] };
  canSign: boolean;
  signerName: string;
  defaultStatement: string;
}) {
  const router = useRouter();
  const { message, fields, busy, call } = useApiCall();
  const api = `/api/projects/${projectId}/pours/${pourId}/report/signatures`;
  const last = revisions[0];
  return (
    <div className="space-y-4">
      <p className="font-semibold" data-testid="signature-state">
        {!last
          ? "Not signed yet."
          : current.signed
            ? `The report as it stands is signed: revision ${last.revision}.`
            : `Changed since revision ${last.revision} was signed; it needs a new signature.`}
      </p>
      <SignedRevisions api={api} revisions={revisions} current={current} />
      {canSign && !current.signed && (
        <form
          className="space-y-3"
          aria-label={`Sign the stressing report of ${pourName}`}
          onSubmit={async (e) => {
            e.preventDefault();
            const data = new FormData(e.currentTarget);
            const result = await call(
              sendJson("POST", api, {
                signerName: String(data.get("signerName") ?? ""),
                licence: String(data.get("licence") ?? ""),
                statement: String(data.get("statement") ?? ""),
              }),
            );
            if (result.ok) router.refresh();
          }}
        >
          <FormMessage tone="error">{message?.text}</FormMessage>
          <div className="grid gap-3 md:grid-cols-2">
            <div>
              <label htmlFor="sign-name" className="field-label">
                Your name as you sign
              </label>
              <input
                id="sign-name"
                name="signerName"
                defaultValue={signerName}
                className="field-input mt-1"
                aria-describedby="sign-name-error"
              />
              <FieldError id="sign-name-error" messages={fields.signerName} />
            </div>
            <div>
              <label htmlFor="sign-licence" className="field-label">
                Licence or certification number
              </label>
              <input
                id="sign-licence"
                name="licence"
                className="field-input mt-1"
                aria-describedby="sign-licence-error"
              />
              <FieldError id="sign-licence-error" messages={fields.licence} />
            </div>
          </div>
          <div>
            <label htmlFor="sign-statement" className="field-label">
              Statement
            </label>
            <textarea
              id="sign-statement"
              name="statement"
              rows={3}
              defaultValue={defaultStatement}
              className="field-input mt-1 py-2"
              aria-describedby="sign-statement-error"
            />
            <FieldError id="sign-statement-error" messages={fields.statement} />
          </div>
          <button type="submit" className="btn-primary" disabled={busy}>
            {busy ? "Signing…" : `Sign revision ${(last?.revision ?? 0) + 1}`}
          </button>
        </form>
      )}
    </div>
  );
}
