"use client";

import { useState } from "react";
import { useForm } from "react-hook-form";
import { useSWRConfig } from "swr";
import { z } from "zod";
import { FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { placeFields, refusedWords } from "@/lib/client/field-errors";
import { formResolver } from "@/lib/client/form-resolver";
import { sendJson } from "@/lib/client/send-json";
import { pourSchema, type PourInput } from "@/lib/schemas/pour";
import { poursKey } from "./pour-table";
import { PER, units } from "@/lib/client/unit-fields";
import { ClientForm } from "@/components/ui/client-form";

const FIELDS = { name: z.string(), level: z.string(), area: units.number(false), plannedStressingDate: z.string() };
type FormIn = { [K in keyof typeof FIELDS]: string };

function resolver(us: boolean) {
  return formResolver(
    FIELDS,
    ({ area, ...v }) => ({
      ...v,
      level: v.level?.trim() || null,
      plannedStressingDate: v.plannedStressingDate || null,
      areaM2: area === null ? null : area * (us ? PER.ft2 : PER.m2),
    }),
    pourSchema,
    { areaM2: "area" },
  );
}

/** Adds a pour (placement) to the project. */
export function PourForm({ projectId, us }: { projectId: string; us: boolean }) {
  const { mutate } = useSWRConfig();
  const [message, setMessage] = useState<{ tone: "error" | "info"; text: string }>();
  const form = useForm<FormIn, unknown, PourInput>({
    resolver: resolver(us),
    defaultValues: { name: "", level: "", area: "", plannedStressingDate: "" },
  });
  const errors = form.formState.errors as Record<string, { message?: string } | undefined>;
  const onSubmit = form.handleSubmit(async (values) => {
    const result = await sendJson("POST", `/api/projects/${projectId}/pours`, values);
    if (!result.ok) {
      const placed = placeFields(result.error.fields, (k) => (k === "areaM2" ? "area" : k in FIELDS ? k : null));
      for (const [k, m] of Object.entries(placed.boxes)) form.setError(k as keyof FormIn, { message: m.join(" ") });
      setMessage({ tone: "error", text: refusedWords(result.error, placed) });
      return;
    }
    setMessage({ tone: "info", text: `Pour ${values.name} added. Import its tendon schedule next.` });
    form.reset();
    void mutate(poursKey(projectId));
  });
  const input = (k: keyof FormIn, label: string, props: { numeric?: boolean; type?: string } = {}) => (
    <FormField id={`p-${k}`} label={label} error={errors[k]?.message} {...props} {...form.register(k)} />
  );
  return (
    <ClientForm onSubmit={onSubmit} noValidate className="card space-y-4">
      <h2 className="text-lead font-semibold">Add a pour</h2>
      <FormMessage tone={message?.tone ?? "info"}>{message?.text}</FormMessage>
      <FormMessage tone="error">{errors.root?.message}</FormMessage>
      <div className="grid gap-4 md:grid-cols-5">
        {input("name", "Name, as drawn")}
        {input("level", "Level")}
        {input("area", `Area, ${us ? "ft²" : "m²"}`, { numeric: true })}
        {input("plannedStressingDate", "Planned stressing", { type: "date" })}
      </div>
      <p className="text-ink-soft">
        A pour&apos;s status follows from its records (planned, stressing, stressed) and is released only by the release
        the engineer signs.
      </p>
      <button className="btn-primary" type="submit" disabled={form.formState.isSubmitting}>
        Add pour
      </button>
    </ClientForm>
  );
}
