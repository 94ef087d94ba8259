"use client";

import { SigningForm } from "./signing-form";

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
  return (
    <SigningForm
      api={api}
      shown={["signerName", "licence", "statement"]}
      label={`Sign the stressing report of ${pourName}`}
      className="space-y-3"
      signerId={(name) => `${idPrefix}-${name}`}
      signerName={signerName}
      defaultStatement={defaultStatement}
      submitLabel={`Sign revision ${nextRevision}`}
      confirmTitle={`Sign revision ${nextRevision} of the stressing report of ${pourName}?`}
      confirmText={<p>Your typed name, licence and statement sign the report as it stands now.</p>}
      onSigned={onSigned}
    />
  );
}
