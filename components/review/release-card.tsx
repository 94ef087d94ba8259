"use client";

import { SignedStatementForm } from "./signed-statement-form";

/**
 * Release of one pour for tail cutting or grouting, signed with the typed name and licence number;
 * the server keeps the time and the sha256 of the pour's report. Refused while anything is open.
 */
export function ReleaseForm({ projectId, pourId, pourName }: { projectId: string; pourId: string; pourName: string }) {
  return (
    <SignedStatementForm
      id={`release-${pourId}`}
      url={`/api/projects/${projectId}/pours/${pourId}/release`}
      field="statement"
      label="Release statement (edit it to say what you checked)"
      suggested={`All tendons of ${pourName} are stressed and accepted; tails may be cut.`}
      act={`Release ${pourName}`}
      question={`Release ${pourName}? The crew may then cut tails, and the pour takes no new record until you reopen it.`}
      signed
    />
  );
}

/** Reopening of a released pour by the engineer of record, with the reason. */
export function ReopenForm({ projectId, pourId, pourName }: { projectId: string; pourId: string; pourName: string }) {
  return (
    <SignedStatementForm
      id={`reopen-${pourId}`}
      url={`/api/projects/${projectId}/pours/${pourId}/reopen`}
      field="reason"
      label="Why the pour is reopened"
      suggested=""
      act={`Reopen ${pourName}`}
      question={`Reopen ${pourName}? The release stops standing; the crew may record again and the pour must be released anew.`}
    />
  );
}
