"use client";

import { useState } from "react";
import { useForm } from "react-hook-form";
import { useSWRConfig } from "swr";
import { z } from "zod";
import { RejudgePreviewNote, type RejudgePreview } from "@/components/setup/edit-preview";
import { FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { placeFields, refusedWords } from "@/lib/client/field-errors";
import { formResolver } from "@/lib/client/form-resolver";
import { sendJson } from "@/lib/client/send-json";
import { calibrationCorrectionSchema, calibrationSchema, type CalibrationInput } from "@/lib/schemas/calibration";
import { PER, shown } from "@/lib/client/unit-fields";
import {
  CALIBRATION_PATHS,
  CALIBRATION_ROWS,
  CalibrationPointsField,
  calibrationBoxes,
  calibrationFromBoxes,
} from "./equipment-forms";
import { equipmentSetsKey } from "./equipment-list";
import { ClientForm } from "@/components/ui/client-form";

type CalibrationPoint = CalibrationInput["points"][number];
type Boxes = { calibratedOn: string; validUntil: string; pointsText: string; laboratory: string; reason: string };
type Corrected = CalibrationInput & { reason: string };

/** A stored point as the admin would type it, in the project's units, without rounding that matters. */
const pointsText = (points: CalibrationPoint[], us: boolean) =>
  points
    .map((p) =>
      us
        ? `${shown(p.pressureMPa, PER.psi, 1)}, ${shown(p.forceN, PER.kip, 4)}`
        : `${shown(p.pressureMPa, PER.MPa, 3)}, ${shown(p.forceN, PER.kN, 3)}`,
    )
    .join("\n");

/** The boxes read in the project's units; the certificate file stays the one on record. */
function resolver(us: boolean, certificateAttachmentId: string | null) {
  return formResolver(
    { ...calibrationBoxes(us), reason: z.string() },
    (v) => ({ ...calibrationFromBoxes(v, certificateAttachmentId), reason: v.reason ?? "" }),
    z.intersection(calibrationSchema, z.object({ reason: calibrationCorrectionSchema.shape.reason })),
    CALIBRATION_PATHS,
    CALIBRATION_ROWS,
  ) as unknown as ReturnType<typeof formResolver<never, Corrected>>;
}

/**
 * Corrects the set's calibration in force: the certificate's figures as they should have been typed
 * (readings, date, expiry, laboratory) and why. The first press asks the server what the correction
 * would do (how many stressed tendons it judges again, whose verdict changes; nothing is written),
 * the second corrects. Any edit after the check asks for a new check. A future date is refused,
 * naming the box. The old figures are kept; stored evaluations keep the calibration they used.
 */
export function CorrectCalibration(props: {
  projectId: string;
  setId: string;
  calibration: {
    id: string;
    calibratedOn: string;
    points: CalibrationPoint[];
    laboratory: string | null;
    certificateAttachmentId: string | null;
  };
  us: boolean;
}) {
  const { mutate } = useSWRConfig();
  const c = props.calibration;
  const id = `correct-${c.id}`;
  const api = `/api/projects/${props.projectId}/equipment-sets/${props.setId}/calibrations/${c.id}/correction`;
  const [message, setMessage] = useState<{ tone: "error" | "info"; text: string }>();
  const [preview, setPreview] = useState<RejudgePreview | null>(null);
  const [busy, setBusy] = useState(false);
  const form = useForm<Boxes, unknown, Corrected>({
    resolver: resolver(props.us, c.certificateAttachmentId),
    defaultValues: {
      calibratedOn: c.calibratedOn,
      validUntil: "",
      pointsText: pointsText(c.points, props.us),
      laboratory: c.laboratory ?? "",
      reason: "",
    },
  });
  const e = form.formState.errors;
  const fieldOf = (path: string) => {
    const key = path.replace(/^calibration\./, "").split(".")[0]!;
    return (key === "points" ? "pointsText" : key) as keyof Boxes;
  };

  const onSubmit = form.handleSubmit(async ({ reason, ...values }) => {
    const body = { reason, calibration: { ...values, certificateAttachmentId: c.certificateAttachmentId } };
    setBusy(true);
    const r = preview
      ? await sendJson<{ reevaluated: number; validUntil: string }>("POST", api, body)
      : await sendJson<RejudgePreview>("POST", `${api}/preview`, body);
    setBusy(false);
    if (!r.ok) {
      setPreview(null);
      const placed = placeFields(r.error.fields, (k) => (fieldOf(k) in form.getValues() ? fieldOf(k) : null));
      for (const [k, m] of Object.entries(placed.boxes)) form.setError(k as keyof Boxes, { message: m.join(" ") });
      return setMessage({ tone: "error", text: refusedWords(r.error, placed) });
    }
    if (!preview) {
      setPreview(r.data as RejudgePreview);
      return setMessage(undefined);
    }
    const done = r.data as { reevaluated: number; validUntil: string };
    setPreview(null);
    setMessage({
      tone: "info",
      text: `Corrected: the new figures are in force, valid to ${done.validUntil}; ${done.reevaluated} tendon(s) judged again.`,
    });
    void mutate(equipmentSetsKey(props.projectId));
  });

  return (
    <details className="mt-2">
      <summary className="btn-quiet w-fit cursor-pointer">Correct this calibration…</summary>
      <ClientForm
        onSubmit={onSubmit}
        onChange={() => preview && setPreview(null)}
        noValidate
        className="mt-2 space-y-3"
        aria-label={`Correct the calibration of ${c.calibratedOn}`}
      >
        <p className="text-ink-soft">
          Type the certificate&apos;s figures as they should have been. The figures typed before are kept beside the
          correction, and evaluations already stored keep the calibration they used; the tendons read with it are judged
          again on the correction.
        </p>
        <FormMessage tone={message?.tone ?? "info"}>{message?.text}</FormMessage>
        <FormMessage tone="error">{e.root?.message}</FormMessage>
        <div className="grid gap-3 md:grid-cols-3">
          {(
            [
              ["calibratedOn", "Calibrated on", "date"],
              ["validUntil", "Valid until (optional)", "date"],
              ["laboratory", "Laboratory (optional)", "text"],
            ] as const
          ).map(([name, label, type]) => (
            <FormField
              key={name}
              id={`${id}-${name}`}
              type={type}
              label={label}
              error={e[name]?.message}
              {...form.register(name)}
            />
          ))}
        </div>
        <CalibrationPointsField
          id={`${id}-points`}
          us={props.us}
          error={e.pointsText?.message}
          {...form.register("pointsText")}
        />
        <FormField
          as="textarea"
          id={`${id}-reason`}
          rows={2}
          label="Why it is corrected"
          error={e.reason?.message}
          {...form.register("reason")}
        />
        {preview && (
          <RejudgePreviewNote
            preview={preview}
            subject="This correction"
            then="Press again to correct."
            testId="correction-preview"
          />
        )}
        <button type="submit" className="btn-primary" disabled={busy}>
          {busy
            ? "Checking…"
            : preview
              ? `Correct the calibration of ${c.calibratedOn}`
              : "Check what the correction changes"}
        </button>
      </ClientForm>
    </details>
  );
}
