"use client";

import { useState } from "react";
import { useForm } from "react-hook-form";
import { useSWRConfig } from "swr";
import { z } from "zod";
import { FileUpload, type UploadedFile } from "@/components/uploads/file-upload";
import { FormMessage } from "@/components/ui/form-message";
import { formResolver } from "@/lib/client/form-resolver";
import { sendJson } from "@/lib/client/send-json";
import { strandLotSchema, type StrandLotInput } from "@/lib/schemas/strand-lot";
import { STRAND_SIZES } from "@/lib/schemas/tendon";
import { strandLotsKey } from "./strand-lot-table";
import { units } from "@/lib/client/unit-fields";
import { MM2_PER_IN2 } from "@/lib/units";

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
    // 1 in² = 645.16 mm² exactly.
    ({ area, ...v }) => ({
      ...v,
      areaMm2: area === null ? null : us ? area * MM2_PER_IN2 : area,
      certificateAttachmentId: v.certificateAttachmentId || null,
    }),
    strandLotSchema,
    { areaMm2: "area" },
  );
}

/** Registers a strand lot with its mill-certificate values and the certificate file. */
export function StrandLotForm({ projectId, us }: { projectId: string; us: boolean }) {
  const { mutate } = useSWRConfig();
  const [message, setMessage] = useState<{ tone: "error" | "info"; text: string }>();
  const [file, setFile] = useState<UploadedFile | null>(null);
  const form = useForm<FormIn, unknown, StrandLotInput>({
    resolver: resolver(us),
    defaultValues: {
      lotNumber: "",
      strandSize: "0.5 in",
      area: "",
      modulusMPa: "",
      breakingLoadN: "",
      certificateAttachmentId: "",
    },
  });
  const errors = form.formState.errors as Record<string, { message?: string } | undefined>;
  const onSubmit = form.handleSubmit(async (values) => {
    const result = await sendJson("POST", `/api/projects/${projectId}/strand-lots`, values);
    if (!result.ok) {
      for (const [k, m] of Object.entries(result.error.fields ?? {}))
        form.setError((k === "areaMm2" ? "area" : k) as keyof FormIn, { message: m.join(" ") });
      setMessage({ tone: "error", text: result.error.message });
      return;
    }
    setMessage({ tone: "info", text: `Lot ${values.lotNumber} registered.` });
    form.reset();
    setFile(null);
    void mutate(strandLotsKey(projectId));
  });
  const input = (k: keyof FormIn, label: string, hint?: string) => (
    <div>
      <label htmlFor={`l-${k}`} className="field-label">
        {label}
      </label>
      <input
        id={`l-${k}`}
        className="field-input mt-1"
        inputMode={k === "lotNumber" ? "text" : "decimal"}
        {...form.register(k)}
        aria-invalid={errors[k] ? true : undefined}
      />
      {hint && <p className="mt-1 text-label text-ink-faint">{hint}</p>}
      {(errors[k]?.message || (k === "area" && errors.areaMm2?.message)) && (
        <p className="mt-1 font-semibold text-signal-stop">{errors[k]?.message ?? errors.areaMm2?.message}</p>
      )}
    </div>
  );
  return (
    <form onSubmit={onSubmit} noValidate className="card space-y-4">
      <h2 className="text-lead font-semibold">Register a strand lot</h2>
      <FormMessage tone={message?.tone ?? "info"}>{message?.text}</FormMessage>
      <FormMessage tone="error">{errors.root?.message}</FormMessage>
      <div className="grid gap-4 md:grid-cols-3">
        {input("lotNumber", "Lot or heat number")}
        <div>
          <label htmlFor="l-strandSize" className="field-label">
            Strand size
          </label>
          <select id="l-strandSize" className="field-input mt-1" {...form.register("strandSize")}>
            {STRAND_SIZES.map((s) => (
              <option key={s}>{s}</option>
            ))}
          </select>
        </div>
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
        label="Mill certificate file"
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
      <button className="btn-primary" type="submit" disabled={form.formState.isSubmitting}>
        Register lot
      </button>
    </form>
  );
}
