"use client";

import { useState } from "react";
import { useSWRConfig } from "swr";
import { RejudgePreviewNote, type RejudgePreview } from "@/components/setup/edit-preview";
import { FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { sendJson } from "@/lib/client/send-json";
import { useApiCall } from "@/lib/client/use-api-call";
import { equipmentSetsKey } from "./equipment-list";
import { ClientForm } from "@/components/ui/client-form";

/**
 * Retires a set's calibration with a reason: it is never picked again, and the tendons that stood
 * on it are judged again on the calibration then in force (none: no force from the gauge). The
 * first press asks the server what the retirement would do (tendons judged again, verdicts
 * changing, flags raised or closed; nothing is written), the second retires. Editing the reason
 * asks for a new check.
 */
export function RetireCalibration(props: {
  projectId: string;
  setId: string;
  calibrationId: string;
  calibratedOn: string;
}) {
  const { mutate } = useSWRConfig();
  const { message, fields, busy, call } = useApiCall(["reason"]);
  const [reason, setReason] = useState("");
  const [preview, setPreview] = useState<RejudgePreview | null>(null);
  const id = `retire-${props.calibrationId}`;
  const api = `/api/projects/${props.projectId}/equipment-sets/${props.setId}/calibrations/${props.calibrationId}/retirement`;
  return (
    <details className="mt-2">
      <summary className="btn-quiet w-fit cursor-pointer">Retire this calibration…</summary>
      <ClientForm
        className="mt-2 space-y-2"
        aria-label={`Retire the calibration of ${props.calibratedOn}`}
        onSubmit={async (e) => {
          e.preventDefault();
          if (!preview) {
            const checked = await call(sendJson<RejudgePreview>("POST", `${api}/preview`, { reason }));
            if (checked.ok) setPreview(checked.data);
            return;
          }
          const result = await call(
            sendJson<{ reevaluated: number }>("POST", api, { reason }),
            (d) => `Retired; ${d.reevaluated} tendon(s) judged again.`,
          );
          setPreview(null);
          if (result.ok) void mutate(equipmentSetsKey(props.projectId));
        }}
      >
        <FormMessage tone={message?.tone ?? "error"}>{message?.text}</FormMessage>
        <FormField
          as="textarea"
          id={`${id}-reason`}
          rows={2}
          label="Why it is retired"
          hint="It will not be used again; the tendons read with it are judged again. Evaluations already stored keep it."
          value={reason}
          onChange={(e) => {
            setReason(e.target.value);
            setPreview(null);
          }}
          error={fields.reason}
        />
        {preview && (
          <RejudgePreviewNote
            preview={preview}
            subject="This retirement"
            then="Press again to retire."
            testId="retirement-preview"
          />
        )}
        <button type="submit" className="btn-primary" disabled={busy}>
          {busy
            ? preview
              ? "Retiring…"
              : "Checking…"
            : preview
              ? `Retire the calibration of ${props.calibratedOn}`
              : "Check what the retirement changes"}
        </button>
      </ClientForm>
    </details>
  );
}
