import type { SignedRevisionView } from "./report-signing";

/**
 * What changed since the last signature and every signed revision with its signer, file hash,
 * changes and signed PDF: the same on the pour's stressing report and the day's inspection report.
 */
export function SignedRevisions({
  api,
  revisions,
  current,
}: {
  /** The signatures endpoint; a revision's PDF is at `${api}/${revision}`. */
  api: string;
  revisions: SignedRevisionView[];
  current: { signed: boolean; changesSinceSigned: string[] };
}) {
  return (
    <>
      {revisions.length > 0 && !current.signed && current.changesSinceSigned.length > 0 && (
        <ul className="list-disc pl-6 text-ink-soft" aria-label="Changes since the last signature">
          {current.changesSinceSigned.map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
      )}
      {revisions.length > 0 && (
        <ol className="space-y-3" aria-label="Signed revisions">
          {revisions.map((r) => (
            <li key={r.revision} className="rounded-md border border-concrete-300 p-3">
              <p className="font-semibold">
                Revision {r.revision}: {r.signerName}, {r.licence}, {r.signedAt}
              </p>
              <p className="break-all text-label text-ink-soft">File sha256 {r.fileSha256}</p>
              {r.changes.length > 0 && (
                <ul className="mt-1 list-disc pl-6 text-label">
                  {r.changes.map((c) => (
                    <li key={c}>{c}</li>
                  ))}
                </ul>
              )}
              <a className="btn-quiet mt-2" href={`${api}/${r.revision}`} download>
                Signed PDF, revision {r.revision}
              </a>
            </li>
          ))}
        </ol>
      )}
    </>
  );
}
