"use client";

import { useState } from "react";
import { useFieldArray, useForm, useWatch } from "react-hook-form";
import { useSWRConfig } from "swr";
import { z } from "zod";
import { units } from "@/lib/client/unit-fields";
import { FormMessage } from "@/components/ui/form-message";
import { formResolver } from "@/lib/client/form-resolver";
import { sendJson } from "@/lib/client/send-json";
import {
  drapeAngleRad,
  KIND_LABELS,
  STRAND_SIZES,
  TENDON_KINDS,
  tendonSchema,
  type TendonInput,
} from "@/lib/schemas/tendon";
import { tendonsKey } from "./tendon-table";

function fields(us: boolean) {
  const system = us ? "US" : "SI";
  const long = us ? "ft" : "m";
  const short = us ? "in" : "mm";
  return {
    tag: z.string(),
    kind: z.enum(TENDON_KINDS),
    strandSize: z.string(),
    strandCount: units.number(),
    ends: z.enum(["A", "B", "both"]),
    jackGripMm: units.length(system, short, false),
    shopElongationMm: units.length(system, short, false),
    strandLotId: z.string(),
    member: z.string(),
    mode: z.enum(["segments", "drape"]),
    segments: z.array(z.object({ length: units.length(system, long, false), angleDeg: units.number(false) })),
    spanLength: units.length(system, long, false),
    spans: units.number(false),
    drape: units.length(system, short, false),
  };
}

function resolver(us: boolean) {
  return formResolver(
    fields(us),
    ({ mode, segments, spanLength, spans, drape, ...v }) => {
      let profile: { lengthMm: number; angleRad: number }[];
      if (mode === "drape") {
        // A parabola dropping h over each half span l turns the tendon by 2h/l (common practice).
        const half = (spanLength ?? 0) / 2;
        profile = Array.from({ length: Math.max(0, Math.round((spans ?? 0) * 2)) }, () => ({
          lengthMm: half,
          angleRad: half > 0 ? drapeAngleRad(drape ?? 0, half) : 0,
        }));
      } else {
        profile = (segments ?? [])
          .filter((s) => s.length !== null)
          .map((s) => ({ lengthMm: s.length!, angleRad: ((s.angleDeg ?? 0) * Math.PI) / 180 }));
      }
      return { ...v, strandLotId: v.strandLotId || null, member: v.member?.trim() || null, segments: profile };
    },
    tendonSchema,
    {},
    { segments: "Segment" },
  );
}
type FormIn = { [K in keyof ReturnType<typeof fields>]: z.input<ReturnType<typeof fields>[K]> };

/** Adds one tendon by hand: profile as segments, or as a drape height over equal spans. */
export function TendonForm({
  projectId,
  pourId,
  us,
  lots,
}: {
  projectId: string;
  pourId: string;
  us: boolean;
  lots: { id: string; lotNumber: string; strandSize: string }[];
}) {
  const { mutate } = useSWRConfig();
  const [message, setMessage] = useState<{ tone: "error" | "info"; text: string }>();
  const long = us ? "ft" : "m";
  const short = us ? "in" : "mm";
  const form = useForm<FormIn, unknown, TendonInput>({
    resolver: resolver(us),
    defaultValues: {
      tag: "",
      kind: "unbonded_monostrand",
      strandSize: "0.5 in",
      strandCount: "1",
      ends: "A",
      jackGripMm: "",
      shopElongationMm: "",
      strandLotId: "",
      member: "",
      mode: "drape",
      segments: [{ length: "", angleDeg: "" }],
      spanLength: "",
      spans: "2",
      drape: "",
    },
  });
  const rows = useFieldArray({ control: form.control, name: "segments" });
  const mode = useWatch({ control: form.control, name: "mode" });
  const errors = form.formState.errors as Record<string, { message?: string } | undefined>;
  const err = (k: string) => errors[k]?.message;

  const onSubmit = form.handleSubmit(async (values) => {
    const result = await sendJson("POST", `/api/projects/${projectId}/pours/${pourId}/tendons`, values);
    if (!result.ok) {
      for (const [k, m] of Object.entries(result.error.fields ?? {}))
        form.setError((k.startsWith("segments") ? "segments" : k in fields(us) ? k : "root") as keyof FormIn, {
          message: m.join(" "),
        });
      setMessage({ tone: "error", text: result.error.message });
      return;
    }
    setMessage({ tone: "info", text: `Tendon ${values.tag} added.` });
    form.reset();
    void mutate(tendonsKey(projectId, pourId));
  });

  const text = (k: keyof FormIn, label: string, hint?: string) => (
    <div>
      <label htmlFor={`t-${k}`} className="field-label">
        {label}
      </label>
      <input
        id={`t-${k}`}
        className="field-input mt-1"
        inputMode={k === "tag" || k === "member" ? "text" : "decimal"}
        {...form.register(k)}
        aria-invalid={err(k) ? true : undefined}
      />
      {hint && <p className="mt-1 text-label text-ink-faint">{hint}</p>}
      {err(k) && <p className="mt-1 font-semibold text-signal-stop">{err(k)}</p>}
    </div>
  );

  return (
    <form onSubmit={onSubmit} noValidate className="card space-y-4">
      <h2 className="text-lead font-semibold">Add a tendon</h2>
      <FormMessage tone={message?.tone ?? "info"}>{message?.text}</FormMessage>
      <FormMessage tone="error">{form.formState.errors.root?.message}</FormMessage>
      <div className="grid gap-4 md:grid-cols-4">
        {text("tag", "Tag as drawn")}
        <div>
          <label htmlFor="t-kind" className="field-label">
            Type
          </label>
          <select id="t-kind" className="field-input mt-1" {...form.register("kind")}>
            {TENDON_KINDS.map((k) => (
              <option key={k} value={k}>
                {KIND_LABELS[k]}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="t-strandSize" className="field-label">
            Strand size
          </label>
          <select id="t-strandSize" className="field-input mt-1" {...form.register("strandSize")}>
            {STRAND_SIZES.map((s) => (
              <option key={s}>{s}</option>
            ))}
          </select>
        </div>
        {text("strandCount", "Strands")}
        <div>
          <label htmlFor="t-ends" className="field-label">
            Stressing end
          </label>
          <select id="t-ends" className="field-input mt-1" {...form.register("ends")}>
            <option value="A">A</option>
            <option value="B">B</option>
            <option value="both">Both</option>
          </select>
        </div>
        {text("jackGripMm", `Jack grip, ${short}`, "Empty: the equipment set's value.")}
        {text("shopElongationMm", `Shop-drawing elongation, ${short}`, "When the detailer gives one.")}
        {text(
          "member",
          "Member",
          "The beam, slab strip or band, as drawn. Empty: the pour is its group for the group average and the wire-break ledger.",
        )}
        <div>
          <label htmlFor="t-strandLotId" className="field-label">
            Strand lot
          </label>
          <select id="t-strandLotId" className="field-input mt-1" {...form.register("strandLotId")}>
            <option value="">None (nominal values)</option>
            {lots.map((l) => (
              <option key={l.id} value={l.id}>
                {l.lotNumber} ({l.strandSize})
              </option>
            ))}
          </select>
          {err("strandLotId") && <p className="mt-1 font-semibold text-signal-stop">{err("strandLotId")}</p>}
        </div>
      </div>
      <fieldset>
        <legend className="field-label">Profile</legend>
        <div className="mt-1 flex gap-4">
          <label className="flex min-h-touch items-center gap-2">
            <input type="radio" value="drape" className="h-6 w-6" {...form.register("mode")} /> Drape over equal spans
          </label>
          <label className="flex min-h-touch items-center gap-2">
            <input type="radio" value="segments" className="h-6 w-6" {...form.register("mode")} /> Segments
          </label>
        </div>
        {mode === "drape" ? (
          <div className="mt-2 grid gap-4 md:grid-cols-3">
            {text("spanLength", `Span, ${long}`)}
            {text("spans", "Number of spans")}
            {text("drape", `Drape height, ${short}`, "Angle change per half span = 2 × drape ÷ half span.")}
          </div>
        ) : (
          <div className="mt-2 space-y-2">
            {rows.fields.map((f, i) => (
              <div key={f.id} className="grid grid-cols-[1fr_1fr_auto] items-end gap-2">
                <div>
                  <label htmlFor={`seg-${i}-l`} className="field-label">
                    Segment {i + 1} length, {long}
                  </label>
                  <input
                    id={`seg-${i}-l`}
                    className="field-input mt-1"
                    inputMode="decimal"
                    {...form.register(`segments.${i}.length`)}
                  />
                </div>
                <div>
                  <label htmlFor={`seg-${i}-a`} className="field-label">
                    Angle change, degrees
                  </label>
                  <input
                    id={`seg-${i}-a`}
                    className="field-input mt-1"
                    inputMode="decimal"
                    {...form.register(`segments.${i}.angleDeg`)}
                  />
                </div>
                <button
                  type="button"
                  className="btn-quiet"
                  onClick={() => rows.remove(i)}
                  aria-label={`Remove segment ${i + 1}`}
                >
                  Remove
                </button>
              </div>
            ))}
            <button type="button" className="btn-quiet" onClick={() => rows.append({ length: "", angleDeg: "" })}>
              Add a segment
            </button>
          </div>
        )}
        {err("segments") && <p className="mt-1 font-semibold text-signal-stop">{err("segments")}</p>}
      </fieldset>
      <button className="btn-primary" type="submit" disabled={form.formState.isSubmitting}>
        Add tendon
      </button>
    </form>
  );
}
