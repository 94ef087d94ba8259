"use client";

import { useState } from "react";
import { useForm, type UseFormRegisterReturn } from "react-hook-form";
import { useSWRConfig } from "swr";
import { z } from "zod";
import { units } from "@/lib/client/unit-fields";
import { FileUpload } from "@/components/uploads/file-upload";
import { RejudgePreviewNote, type RejudgePreview } from "@/components/setup/edit-preview";
import { FormField } from "@/components/ui/form-field";
import { FieldError, FormMessage } from "@/components/ui/form-message";
import { placeFields, refusedWords } from "@/lib/client/field-errors";
import { formResolver } from "@/lib/client/form-resolver";
import { sendJson, type ApiError } from "@/lib/client/send-json";
import { calibrationSchema, type CalibrationInput } from "@/lib/schemas/calibration";
import { equipmentSetSchema, type EquipmentSetInput } from "@/lib/schemas/equipment";
import { isInputError, parseForce, parsePressure } from "@/lib/units";
import { showNumber } from "@/lib/format/quantities";
import { equipmentSetsKey, useEquipmentSets, type EquipmentSetList } from "./equipment-list";
import { ClientForm } from "@/components/ui/client-form";

type Errors = Record<string, { message?: string } | undefined>;

function setFields(us: boolean) {
  const system = us ? "US" : "SI";
  return {
    name: z.string(),
    jackSerial: z.string(),
    gaugeSerial: z.string(),
    pumpSerial: z.string(),
    jackGripMm: units.length(system, us ? "in" : "mm", false),
    maxForceN: units.force(system, us ? "kip" : "kN", false),
    drawInMm: units.length(system, us ? "in" : "mm", false),
  };
}

function setResolver(us: boolean) {
  return formResolver(setFields(us), (v) => ({ ...v, pumpSerial: v.pumpSerial?.trim() || null }), equipmentSetSchema);
}

export function EquipmentSetForm({ projectId, us }: { projectId: string; us: boolean }) {
  const { mutate } = useSWRConfig();
  const [message, setMessage] = useState<{ tone: "error" | "info"; text: string }>();
  const form = useForm<{ [K in keyof ReturnType<typeof setFields>]: string }, unknown, EquipmentSetInput>({
    resolver: setResolver(us),
    defaultValues: {
      name: "",
      jackSerial: "",
      gaugeSerial: "",
      pumpSerial: "",
      jackGripMm: "",
      maxForceN: "",
      drawInMm: "",
    },
  });
  const e = form.formState.errors as Errors;
  const onSubmit = form.handleSubmit(async (values) => {
    const r = await sendJson("POST", `/api/projects/${projectId}/equipment-sets`, values);
    if (!r.ok) {
      const placed = placeFields(r.error.fields, (k) => (k in setFields(us) ? k : null));
      for (const [k, m] of Object.entries(placed.boxes)) form.setError(k as "name", { message: m.join(" ") });
      return setMessage({ tone: "error", text: refusedWords(r.error, placed) });
    }
    setMessage({ tone: "info", text: `${values.name} added. Add its calibration next.` });
    form.reset();
    void mutate(equipmentSetsKey(projectId));
  });
  return (
    <ClientForm onSubmit={onSubmit} noValidate className="card space-y-4">
      <h2 className="text-lead font-semibold">Add an equipment set</h2>
      <FormMessage tone={message?.tone ?? "info"}>{message?.text}</FormMessage>
      <FormMessage tone="error">{e.root?.message}</FormMessage>
      <div className="grid gap-4 md:grid-cols-3">
        <FormField id="e-name" label="Set name" error={e.name?.message} {...form.register("name")} />
        <FormField id="e-jack" label="Jack serial" error={e.jackSerial?.message} {...form.register("jackSerial")} />
        <FormField id="e-gauge" label="Gauge serial" error={e.gaugeSerial?.message} {...form.register("gaugeSerial")} />
        <FormField
          id="e-pump"
          label="Pump serial (optional)"
          error={e.pumpSerial?.message}
          {...form.register("pumpSerial")}
        />
        <FormField
          id="e-grip"
          label={`Jack grip length, ${us ? "in" : "mm"} (optional)`}
          numeric
          error={e.jackGripMm?.message}
          {...form.register("jackGripMm")}
        />
        <FormField
          id="e-max"
          label={`Rated force, ${us ? "kip" : "kN"} (optional)`}
          numeric
          error={e.maxForceN?.message}
          {...form.register("maxForceN")}
        />
        <FormField
          id="e-draw-in"
          label={`Draw-in per re-grip, ${us ? "in" : "mm"} (optional)`}
          numeric
          hint="What the wedges give back each time the jack re-grips between strokes, from the jack maker or a trial pull. Ram-travel records that type none use it."
          error={e.drawInMm?.message}
          {...form.register("drawInMm")}
        />
      </div>
      <button className="btn-primary" type="submit">
        Add set
      </button>
    </ClientForm>
  );
}

/** "pressure, force" per line, in the project's units unless a unit is typed. */
export function readPoints(text: string, us: boolean): { points: CalibrationInput["points"]; error: string | null } {
  const system = us ? "US" : "SI";
  const points: CalibrationInput["points"] = [];
  const lines = text
    .split(/\r?\n/)
    .map((l) => l.trim())
    .filter(Boolean);
  for (const [i, line] of lines.entries()) {
    const [p, f, extra] = line.split(/[,;\t]/).map((s) => s.trim());
    try {
      if (!p || !f || extra !== undefined) throw new Error("give pressure, force");
      points.push({
        pressureMPa: parsePressure(p, { field: "pressure", system }),
        forceN: parseForce(f, { field: "force", system }),
      });
    } catch (error) {
      return {
        points,
        error: `Line ${i + 1} "${line}": ${isInputError(error) ? error.message.replace(/^[^:]*: /, "") : "write pressure, force"}.`,
      };
    }
  }
  return { points, error: null };
}

/** The boxes of a calibration's figures, read in the project's units (the points one pair a line). */
export function calibrationBoxes(us: boolean) {
  return {
    calibratedOn: z.string(),
    validUntil: z.string(),
    pointsText: z.string().transform((text, ctx) => {
      const { points, error } = readPoints(text, us);
      if (error) ctx.addIssue({ code: "custom", message: error });
      return points;
    }),
    laboratory: z.string(),
  };
}

/** A calibration for `calibrationSchema` from its boxes as read (null: could not be read) and its certificate. */
export function calibrationFromBoxes(
  v: {
    calibratedOn: string | null;
    validUntil: string | null;
    pointsText: CalibrationInput["points"] | null;
    laboratory: string | null;
  },
  certificateAttachmentId: string | null,
) {
  return {
    calibratedOn: v.calibratedOn,
    validUntil: v.validUntil || null,
    points: v.pointsText ?? [],
    laboratory: v.laboratory?.trim() || null,
    certificateAttachmentId,
  };
}

/** `formResolver`'s paths and rows for `calibrationBoxes`: the points' messages go to their box, by line. */
export const CALIBRATION_PATHS = { points: "pointsText" } as const;
export const CALIBRATION_ROWS = { pointsText: "Line" } as const;

/** The points box of a calibration form, its label naming the units they are read in. */
export function CalibrationPointsField({
  id,
  us,
  error,
  ...box
}: { id: string; us: boolean; error?: string } & UseFormRegisterReturn) {
  return (
    <FormField
      as="textarea"
      id={id}
      rows={6}
      className="font-mono"
      label={`Calibration points: gauge pressure, force (${us ? "psi, kip" : "MPa, kN"}), one pair per line`}
      placeholder={us ? "1000, 6.3\n2000, 13.4" : "10, 50.2\n20, 101.6"}
      error={error}
      {...box}
    />
  );
}

function calFields(us: boolean) {
  return { ...calibrationBoxes(us), certificateAttachmentId: z.string() };
}

function calResolver(us: boolean) {
  return formResolver(
    calFields(us),
    (v) => calibrationFromBoxes(v, v.certificateAttachmentId || null),
    calibrationSchema,
    CALIBRATION_PATHS,
    CALIBRATION_ROWS,
  );
}

export function CalibrationForm({
  projectId,
  us,
  initial,
  validityDays,
}: {
  projectId: string;
  us: boolean;
  initial: EquipmentSetList;
  validityDays: number;
}) {
  const { mutate } = useSWRConfig();
  // The same list as the cards above, so a set added a moment ago can be chosen at once.
  const sets = useEquipmentSets(projectId, initial).data.equipmentSets;
  const [chosen, setChosen] = useState("");
  const setId = sets.some((s) => s.id === chosen) ? chosen : (sets[0]?.id ?? "");
  const [message, setMessage] = useState<{ tone: "error" | "info"; text: string }>();
  const form = useForm<{ [K in keyof ReturnType<typeof calFields>]: string }, unknown, CalibrationInput>({
    resolver: calResolver(us),
    defaultValues: { calibratedOn: "", validUntil: "", pointsText: "", laboratory: "", certificateAttachmentId: "" },
  });
  const e = form.formState.errors as Errors;
  // A calibration that judges stressed tendons again is shown first and saved on a second press.
  const [preview, setPreview] = useState<RejudgePreview | null>(null);
  const [busy, setBusy] = useState(false);
  const refused = (error: ApiError) => {
    setPreview(null);
    const placed = placeFields(error.fields, (k) =>
      k.startsWith("points") ? "pointsText" : k in calFields(us) ? k : null,
    );
    for (const [k, m] of Object.entries(placed.boxes)) form.setError(k as "calibratedOn", { message: m.join(" ") });
    setMessage({ tone: "error", text: refusedWords(error, placed) });
  };
  const onSubmit = form.handleSubmit(async (values) => {
    const api = `/api/projects/${projectId}/equipment-sets/${setId}/calibrations`;
    setBusy(true);
    if (!preview) {
      const checked = await sendJson<RejudgePreview>("POST", `${api}/preview`, values);
      if (!checked.ok) {
        setBusy(false);
        return refused(checked.error);
      }
      if (checked.data.rejudged > 0) {
        setBusy(false);
        setMessage(undefined);
        return setPreview(checked.data);
      }
    }
    const r = await sendJson<{ validUntil: string; r2: number; warnings: string[] }>("POST", api, values);
    setBusy(false);
    if (!r.ok) return refused(r.error);
    setPreview(null);
    setMessage({
      tone: "info",
      text: `Calibration saved: r² = ${showNumber(r.data.r2, 5)}, valid to ${r.data.validUntil}. ${r.data.warnings.join(" ")}`,
    });
    form.reset();
    void mutate(equipmentSetsKey(projectId));
  });
  if (!sets.length) return null;
  return (
    <ClientForm
      onSubmit={onSubmit}
      onChange={() => preview && setPreview(null)}
      noValidate
      className="card space-y-4"
      aria-label="Add a calibration"
    >
      <h2 className="text-lead font-semibold">Add a calibration</h2>
      <FormMessage tone={message?.tone ?? "info"}>{message?.text}</FormMessage>
      <FormMessage tone="error">{e.root?.message}</FormMessage>
      <div className="grid gap-4 md:grid-cols-3">
        <FormField
          as="select"
          id="c-set"
          label="Equipment set"
          value={setId}
          onChange={(ev) => setChosen(ev.target.value)}
        >
          {sets.map((s) => (
            <option key={s.id} value={s.id}>
              {s.name}
            </option>
          ))}
        </FormField>
        <FormField
          id="c-on"
          type="date"
          label="Calibrated on"
          error={e.calibratedOn?.message}
          {...form.register("calibratedOn")}
        />
        <FormField
          id="c-until"
          type="date"
          label="Valid until (optional)"
          hint={`Empty: ${validityDays} days after calibration, the project's rule; the earlier date wins.`}
          error={e.validUntil?.message}
          {...form.register("validUntil")}
        />
      </div>
      <CalibrationPointsField
        id="c-points"
        us={us}
        error={e.pointsText?.message ?? e.points?.message}
        {...form.register("pointsText")}
      />
      <FormField
        id="c-lab"
        label="Laboratory (optional)"
        error={e.laboratory?.message}
        {...form.register("laboratory")}
      />
      <FileUpload
        projectId={projectId}
        purpose="calibration_certificate"
        label="Calibration certificate file"
        onUploaded={(f) => form.setValue("certificateAttachmentId", f.id)}
      />
      <FieldError
        id="c-certificate-error"
        messages={e.certificateAttachmentId?.message ? [e.certificateAttachmentId.message] : undefined}
      />
      {preview && (
        <RejudgePreviewNote
          preview={preview}
          subject="This calibration"
          then="Press again to save it."
          testId="calibration-preview"
        />
      )}
      <button className="btn-primary" type="submit" disabled={busy}>
        {busy ? "Checking…" : preview ? "Save the calibration and judge again" : "Save calibration"}
      </button>
    </ClientForm>
  );
}
