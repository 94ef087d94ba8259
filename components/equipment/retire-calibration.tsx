"use client";

import { useState } from "react";
import { useSWRConfig } from "swr";
import { FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { sendJson } from "@/lib/client/send-json";
import { useApiCall } from "@/lib/client/use-api-call";
import { equipmentSetsKey } from "./equipment-list";

/**
 * Retires a set's calibration with a reason: it is never picked again, and the tendons that stood
 * on it are judged again on the calibration then in force (none: no force from the gauge).
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
  const id = `retire-${props.calibrationId}`;
  return (
    <details className="mt-2">
      <summary className="btn-quiet w-fit cursor-pointer">Retire this calibration…</summary>
      <form
        className="mt-2 space-y-2"
        aria-label={`Retire the calibration of ${props.calibratedOn}`}
        onSubmit={async (e) => {
          e.preventDefault();
          const result = await call(
            sendJson<{ reevaluated: number }>(
              "POST",
              `/api/projects/${props.projectId}/equipment-sets/${props.setId}/calibrations/${props.calibrationId}/retirement`,
              { reason },
            ),
            (d) => `Retired; ${d.reevaluated} tendon(s) judged again.`,
          );
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
          onChange={(e) => setReason(e.target.value)}
          error={fields.reason}
        />
        <button type="submit" className="btn-primary" disabled={busy}>
          Retire the calibration of {props.calibratedOn}
        </button>
      </form>
    </details>
  );
}
