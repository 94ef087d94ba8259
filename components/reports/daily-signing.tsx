"use client";

import { useRouter } from "next/navigation";
import { FieldError, FormMessage } from "@/components/ui/form-message";
import { sendJson } from "@/lib/client/send-json";
import { useApiCall } from "@/lib/client/use-api-call";
import type { SignedRevisionView } from "./report-signing";
import { SignedRevisions } from "./signed-revisions";

/**
 * The day's signed special-inspection reports and, for the inspector, the remarks and the form that
 * signs the day as it stands. The remarks print on the report and are part of what is signed: a
 * change to them asks for a new revision. Times come preformatted from the server.
 */
export function DailySigning({
  projectId,
  day,
  revisions,
  current,
  remarks,
  canSign,
  signerName,
  defaultStatement,
}: {
  projectId: string;
  day: string;
  revisions: SignedRevisionView[];
  current: { signed: boolean; changesSinceSigned: string[] };
  remarks: string;
  canSign: boolean;
  signerName: string;
  defaultStatement: string;
}) {
  const router = useRouter();
  const { message, fields, busy, call } = useApiCall();
  const api = `/api/projects/${projectId}/daily-reports/${day}/signatures`;
  const last = revisions[0];
  return (
    <div className="space-y-4">
      <p className="font-semibold" data-testid="daily-signature-state">
        {!last
          ? `The report of ${day} is not signed yet.`
          : current.signed
            ? `The report of ${day} as it stands is signed: revision ${last.revision}.`
            : `Changed since revision ${last.revision} was signed; it needs a new signature.`}
      </p>
      <SignedRevisions api={api} revisions={revisions} current={current} />
      {canSign ? (
        <form
          className="space-y-3"
          aria-label={`Sign the daily inspection report of ${day}`}
          onSubmit={async (e) => {
            e.preventDefault();
            const data = new FormData(e.currentTarget);
            const result = await call(
              sendJson("POST", api, {
                signerName: String(data.get("signerName") ?? ""),
                licence: String(data.get("licence") ?? ""),
                statement: String(data.get("statement") ?? ""),
                remarks: String(data.get("remarks") ?? ""),
              }),
            );
            if (result.ok) router.refresh();
          }}
        >
          <FormMessage tone="error">{message?.text}</FormMessage>
          <div>
            <label htmlFor="daily-remarks" className="field-label">
              Your remarks for the day
            </label>
            <p id="daily-remarks-hint" className="text-label text-ink-soft">
              What you observed that the records do not say: weather, access, what you witnessed, what you asked for.
              Printed on the report; changing them needs a new signature.
            </p>
            <textarea
              id="daily-remarks"
              name="remarks"
              rows={4}
              defaultValue={remarks}
              className="field-input mt-1 py-2"
              aria-describedby="daily-remarks-hint daily-remarks-error"
            />
            <FieldError id="daily-remarks-error" messages={fields.remarks} />
          </div>
          <div className="grid gap-3 md:grid-cols-2">
            <div>
              <label htmlFor="daily-sign-name" className="field-label">
                Your name as you sign
              </label>
              <input
                id="daily-sign-name"
                name="signerName"
                defaultValue={signerName}
                className="field-input mt-1"
                aria-describedby="daily-sign-name-error"
              />
              <FieldError id="daily-sign-name-error" messages={fields.signerName} />
            </div>
            <div>
              <label htmlFor="daily-sign-licence" className="field-label">
                Licence or certification number
              </label>
              <input
                id="daily-sign-licence"
                name="licence"
                className="field-input mt-1"
                aria-describedby="daily-sign-licence-error"
              />
              <FieldError id="daily-sign-licence-error" messages={fields.licence} />
            </div>
          </div>
          <div>
            <label htmlFor="daily-sign-statement" className="field-label">
              Statement of conformance
            </label>
            <textarea
              id="daily-sign-statement"
              name="statement"
              rows={3}
              defaultValue={defaultStatement}
              className="field-input mt-1 py-2"
              aria-describedby="daily-sign-statement-error"
            />
            <FieldError id="daily-sign-statement-error" messages={fields.statement} />
          </div>
          <button type="submit" className="btn-primary" disabled={busy}>
            {busy
              ? "Signing…"
              : `Sign revision ${(last?.revision ?? 0) + 1} of ${day}${current.signed ? " with changed remarks" : ""}`}
          </button>
        </form>
      ) : (
        <p className="text-ink-soft">
          {remarks ? `Inspector's remarks: ${remarks}` : "The inspector has written no remarks for this day."} Only the
          special inspector signs this report.
        </p>
      )}
    </div>
  );
}
