"use client";

import { useRouter } from "next/navigation";
import { PourSignForm } from "./pour-sign-form";
import { SignedRevisions } from "./signed-revisions";
import { signatureStanding } from "@/lib/reports/signature-lines";

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
  const api = `/api/projects/${projectId}/pours/${pourId}/report/signatures`;
  const last = revisions[0];
  return (
    <div className="space-y-4">
      <p className="font-semibold" data-testid="signature-state">
        {signatureStanding("The report", last?.revision ?? null, current.signed)}
      </p>
      <SignedRevisions api={api} revisions={revisions} current={current} />
      {canSign && !current.signed && (
        <PourSignForm
          api={api}
          pourName={pourName}
          nextRevision={(last?.revision ?? 0) + 1}
          signerName={signerName}
          defaultStatement={defaultStatement}
          onSigned={() => router.refresh()}
        />
      )}
    </div>
  );
}
