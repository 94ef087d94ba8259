"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { useSWRConfig } from "swr";
import { z } from "zod";
import { FileUpload, type UploadedFile } from "@/components/uploads/file-upload";
import { FormField } from "@/components/ui/form-field";
import { FieldError, FormMessage } from "@/components/ui/form-message";
import { placeFields, refusedWords } from "@/lib/client/field-errors";
import { formResolver } from "@/lib/client/form-resolver";
import { sendJson, type ApiError } from "@/lib/client/send-json";
import { strandLotSchema, type StrandLotInput } from "@/lib/schemas/strand-lot";
import { STRAND_SIZES } from "@/lib/schemas/tendon";
import type { StrandLotView } from "@/lib/server/list-strand-lots";
import { savedWords, usePreviewedEdit } from "./edit-preview";
import { strandLotsKey } from "./strand-lot-table";
import { PER, shown, units } from "@/lib/client/unit-fields";
import { ClientForm } from "@/components/ui/client-form";

function fields(us: boolean) {
  const system = us ? "US" : "SI";
  return {
    lotNumber: z.string(),
    strandSize: z.string(),
    area: units.number(),
    modulusMPa: units.pressure(system, us ? "ksi" : "MPa"),
    breakingLoadN: units.force(system, us ? "kip" : "kN"),
    certificateAttachmentId: z.string(),
  };
}
type FormIn = { [K in keyof ReturnType<typeof fields>]: string };

function resolver(us: boolean) {
  return formResolver(
    fields(us),
    ({ area, ...v }) => ({
      ...v,
      areaMm2: area === null ? null : area * (us ? PER.in2 : PER.mm2),
      certificateAttachmentId: v.certificateAttachmentId || null,
    }),
    strandLotSchema,
    { areaMm2: "area" },
  );
}

/** A stored lot's values as the form shows them, in the project's units. */
function valuesOf(lot: StrandLotView, us: boolean): FormIn {
  return {
    lotNumber: lot.lotNumber,
    strandSize: lot.strandSize,
    area: shown(lot.areaMm2, us ? PER.in2 : PER.mm2, us ? 5 : 2),
    modulusMPa: shown(lot.modulusMPa, us ? PER.ksi : PER.MPa, 0),
    breakingLoadN: shown(lot.breakingLoadN, us ? PER.kip : PER.kN, 2),
    certificateAttachmentId: lot.certificateAttachmentId ?? "",
  };
}

/**
 * Registers a strand lot with its mill-certificate values and the certificate file, or, given a
 * `lot`, corrects one: before an edit that moves a value a prediction reads is saved, the edit's
 * preview says how many stressed tendons it judges again and how many verdicts change.
 */
export function StrandLotForm({ projectId, us, lot }: { projectId: string; us: boolean; lot?: StrandLotView }) {
  const { mutate } = useSWRConfig();
  const router = useRouter();
  const [message, setMessage] = useState<{ tone: "error" | "info"; text: string }>();
  const [file, setFile] = useState<UploadedFile | null>(null);
  const initial = lot ? valuesOf(lot, us) : undefined;
  const form = useForm<FormIn, unknown, StrandLotInput>({
    resolver: resolver(us),
    defaultValues: initial ?? {
      lotNumber: "",
      strandSize: "0.5 in",
      area: "",
      modulusMPa: "",
      breakingLoadN: "",
      certificateAttachmentId: "",
    },
  });
  const errors = form.formState.errors as Record<string, { message?: string } | undefined>;
  const refused = (error: ApiError) => {
    const placed = placeFields(error.fields, (k) => (k === "areaMm2" ? "area" : k in fields(us) ? k : null));
    for (const [k, m] of Object.entries(placed.boxes)) form.setError(k as keyof FormIn, { message: m.join(" ") });
    setMessage({ tone: "error", text: refusedWords(error, placed) });
  };
  /** A box left as it was shown keeps the stored value to the last digit, so it moves nothing. */
  const unchangedKept = (values: StrandLotInput): StrandLotInput => {
    if (!lot || !initial) return values;
    const typed = form.getValues();
    return {
      ...values,
      areaMm2: typed.area === initial.area ? lot.areaMm2 : values.areaMm2,
      modulusMPa: typed.modulusMPa === initial.modulusMPa ? lot.modulusMPa : values.modulusMPa,
      breakingLoadN: typed.breakingLoadN === initial.breakingLoadN ? lot.breakingLoadN : values.breakingLoadN,
    };
  };
  const edit = usePreviewedEdit<StrandLotInput>({
    url: `/api/projects/${projectId}/strand-lots/${lot?.id}`,
    what: `lot ${lot?.lotNumber}`,
    refused,
    saved: (values, reevaluated) => {
      setMessage({ tone: "info", text: savedWords(`Lot ${values.lotNumber}`, reevaluated) });
      void mutate(strandLotsKey(projectId));
      router.refresh();
    },
  });
  const onSubmit = form.handleSubmit(async (typed) => {
    setMessage(undefined);
    if (lot) return edit.submit(unchangedKept(typed));
    const result = await sendJson("POST", `/api/projects/${projectId}/strand-lots`, typed);
    if (!result.ok) return refused(result.error);
    setMessage({ tone: "info", text: `Lot ${typed.lotNumber} registered.` });
    form.reset();
    setFile(null);
    void mutate(strandLotsKey(projectId));
  });
  // The edit form and the register form may share the page: each box keeps an id of its own.
  const idp = lot ? "e" : "l";
  const input = (k: keyof FormIn, label: string, hint?: string) => (
    <FormField
      id={`${idp}-${k}`}
      label={label}
      hint={hint}
      numeric={k !== "lotNumber"}
      error={errors[k]?.message}
      {...form.register(k)}
    />
  );
  return (
    <ClientForm
      onSubmit={onSubmit}
      noValidate
      className="card space-y-4"
      id={lot ? "edit-lot" : undefined}
      aria-labelledby={`${idp}-heading`}
    >
      <h2 id={`${idp}-heading`} className="text-lead font-semibold">
        {lot ? `Edit lot ${lot.lotNumber}` : "Register a strand lot"}
      </h2>
      {lot && (
        <p className="text-ink-soft">
          A change of area, modulus or strand size judges the lot&apos;s stressed tendons again ({lot.tendonCount}{" "}
          tendon{lot.tendonCount === 1 ? "" : "s"} use it); you are told how many verdicts change before it is saved.
        </p>
      )}
      <FormMessage tone={message?.tone ?? "info"}>{message?.text}</FormMessage>
      <FormMessage tone="error">{errors.root?.message}</FormMessage>
      <div className="grid gap-4 md:grid-cols-3">
        {input("lotNumber", "Lot or heat number")}
        <FormField
          as="select"
          id={`${idp}-strandSize`}
          label="Strand size"
          error={errors.strandSize?.message}
          {...form.register("strandSize")}
        >
          {STRAND_SIZES.map((s) => (
            <option key={s}>{s}</option>
          ))}
        </FormField>
        {input(
          "area",
          `Area, ${us ? "in²" : "mm²"}`,
          us ? "Nominal 0.153 in² for 0.5 in strand." : "Nominal 98.7 mm² for 12.7 mm strand.",
        )}
        {input(
          "modulusMPa",
          `Modulus, ${us ? "ksi" : "MPa"}`,
          us ? "Design value 28,500 ksi." : "Design value 196,500 MPa.",
        )}
        {input("breakingLoadN", `Breaking load, ${us ? "kip" : "kN"}`, "From the mill certificate, per strand.")}
      </div>
      <FileUpload
        projectId={projectId}
        purpose="mill_certificate"
        label={lot ? "Replace the mill certificate file" : "Mill certificate file"}
        onUploaded={(f) => {
          setFile(f);
          form.setValue("certificateAttachmentId", f.id);
        }}
      />
      {file && (
        <p>
          Attached: {file.originalName} ({(file.sizeBytes / 1024).toFixed(0)} KB, sha256 {file.sha256.slice(0, 12)}…)
        </p>
      )}
      <FieldError
        id={`${idp}-certificateAttachmentId-error`}
        messages={errors.certificateAttachmentId?.message ? [errors.certificateAttachmentId.message] : undefined}
      />
      <div className="flex flex-wrap items-center gap-3">
        <button className="btn-primary" type="submit" disabled={form.formState.isSubmitting || edit.saving}>
          {lot ? "Save changes" : "Register lot"}
        </button>
        {lot && (
          <a className="btn-quiet" href={`/projects/${projectId}/strand-lots`}>
            Close without saving
          </a>
        )}
      </div>
      {lot && edit.dialog}
    </ClientForm>
  );
}
