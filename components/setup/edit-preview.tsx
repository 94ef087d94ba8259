"use client";

import { ConfirmDialog } from "@/components/ui/confirm-dialog";

/** What saving an edit would do to the stressed tendons (the answer of the edit's preview route). */
export interface EditPreview {
  rejudged: number;
  verdictsChanging: number;
  flagsClosing: number;
}

const count = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** The preview in words, for the question before the save. */
export function previewWords(p: EditPreview): string {
  const verdicts =
    p.verdictsChanging === 0
      ? "no verdict or deviation changes"
      : `the verdict or deviation of ${count(p.verdictsChanging, "tendon changes", "tendons change")}`;
  const flags = p.flagsClosing ? `; ${count(p.flagsClosing, "open flag closes", "open flags close")}` : "";
  return `Saving judges ${count(p.rejudged, "stressed tendon", "stressed tendons")} again on the new values: ${verdicts}${flags}.`;
}

/**
 * Asks once before an edit that judges stressed tendons again: it says how many, and how many
 * verdicts change, as the preview found them. Each tendon gets a new evaluation naming the edit;
 * the earlier evaluations stay in its trail.
 */
export function EditPreviewDialog({
  preview,
  what,
  busy,
  onConfirm,
  onCancel,
}: {
  preview: EditPreview | null;
  what: string;
  busy: boolean;
  onConfirm: () => void;
  onCancel: () => void;
}) {
  return (
    <ConfirmDialog
      open={preview !== null}
      title={`Save the edit of ${what}?`}
      confirmLabel={busy ? "Saving…" : "Save and judge again"}
      cancelLabel="Keep editing"
      onConfirm={onConfirm}
      onCancel={onCancel}
    >
      {preview && <p className="font-semibold">{previewWords(preview)}</p>}
      <p>
        Each of them gets a new evaluation that names this edit; the earlier evaluations stay in its trail. Flags the
        new judgement raises are e-mailed as usual.
      </p>
    </ConfirmDialog>
  );
}
