"use client";

import { useState } from "react";
import { ConfirmDialog } from "@/components/ui/confirm-dialog";
import { sendJson, type ApiError } from "@/lib/client/send-json";
import type { RejudgePreview } from "@/lib/server/preview-rejudging";

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

/**
 * The save of an edit that may judge stressed tendons again: the edit goes to its preview route
 * first; when it judges any again, the dialog asks before the save, otherwise it is saved at once.
 * `url` is the stored row's route (PATCH there, POST to its `/preview`).
 */
export function usePreviewedEdit<V>(props: {
  url: string;
  /** What `what` the dialog names ("lot H-231"). */
  what: string;
  refused: (error: ApiError) => void;
  /** Once saved: how many stressed tendons were judged again. */
  saved: (values: V, reevaluated: number) => void;
}) {
  const [asked, setAsked] = useState<{ values: V; preview: EditPreview } | null>(null);
  const [saving, setSaving] = useState(false);
  const save = async (values: V) => {
    setSaving(true);
    const result = await sendJson<{ reevaluated: number }>("PATCH", props.url, values);
    setSaving(false);
    setAsked(null);
    if (!result.ok) return props.refused(result.error);
    props.saved(values, result.data.reevaluated);
  };
  const submit = async (values: V) => {
    const preview = await sendJson<EditPreview>("POST", `${props.url}/preview`, values);
    if (!preview.ok) return props.refused(preview.error);
    if (preview.data.rejudged > 0) return setAsked({ values, preview: preview.data });
    return save(values);
  };
  const dialog = (
    <EditPreviewDialog
      preview={asked?.preview ?? null}
      what={props.what}
      busy={saving}
      onConfirm={() => asked && void save(asked.values)}
      onCancel={() => setAsked(null)}
    />
  );
  return { saving, submit, dialog };
}

/** The words once an edit is saved ("Lot H-231 saved; 3 stressed tendons were judged again."). */
export function savedWords(subject: string, reevaluated: number): string {
  const again = reevaluated
    ? `; ${reevaluated} stressed tendon${reevaluated === 1 ? " was" : "s were"} judged again`
    : "";
  return `${subject} saved${again}.`;
}

/** What a calibration or settings change would do: the answer of its preview route (`trialRejudging`). */
export type { RejudgePreview };

/** True when the change touches any stored verdict or flag, so the admin is asked before it is saved. */
export const rejudgeMatters = (p: RejudgePreview) => p.verdictsChanging > 0 || p.flagsRaising > 0 || p.flagsClosing > 0;

/**
 * The preview in words, one wording for every screen that asks it ("This correction judges 2
 * stressed tendons again; 1 verdict changes: 2-1-U06; 1 flag is raised."). Flags are told
 * apart from verdicts: a group-average band or a member's wire-loss limit moves only flags.
 */
export function rejudgeWords(p: RejudgePreview, subject: string): string {
  const shown = p.tags.slice(0, 12).join(", ") + (p.tags.length > 12 ? ", …" : "");
  const verdicts =
    p.verdictsChanging === 0
      ? "no verdict changes"
      : `${count(p.verdictsChanging, "verdict changes", "verdicts change")}: ${shown}`;
  const flags = [
    p.flagsRaising ? `${count(p.flagsRaising, "flag is", "flags are")} raised` : "",
    p.flagsClosing ? `${count(p.flagsClosing, "open flag closes", "open flags close")}` : "",
  ].filter(Boolean);
  return `${subject} judges ${count(p.rejudged, "stressed tendon", "stressed tendons")} again; ${verdicts}${flags.map((f) => `; ${f}`).join("")}.`;
}

/** The preview shown above a form's confirming button, with what the second press does. */
export function RejudgePreviewNote({
  preview,
  subject,
  then,
  testId,
}: {
  preview: RejudgePreview;
  subject: string;
  then: string;
  testId: string;
}) {
  return (
    <p role="status" className="rounded-md border-2 border-ink p-3 font-semibold" data-testid={testId}>
      {rejudgeWords(preview, subject)} {then}
    </p>
  );
}
