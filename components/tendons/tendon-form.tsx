"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { useFieldArray, useForm, useWatch } from "react-hook-form";
import { useSWRConfig } from "swr";
import { z } from "zod";
import { PER, shown, units } from "@/lib/client/unit-fields";
import { savedWords, usePreviewedEdit } from "@/components/setup/edit-preview";
import { FormField } from "@/components/ui/form-field";
import { FieldError, FormMessage } from "@/components/ui/form-message";
import { placeFields, refusedWords } from "@/lib/client/field-errors";
import { formResolver } from "@/lib/client/form-resolver";
import { sendJson, type ApiError } from "@/lib/client/send-json";
import { drapeAngleRad, KIND_LABELS, STRAND_SIZES, tendonSchema, type TendonInput } from "@/lib/schemas/tendon";
import { TENDON_KINDS } from "@/lib/schemas/domain";
import { tendonsKey } from "./tendon-table";
import { ClientForm } from "@/components/ui/client-form";

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
    jackingForceN: units.force(system, us ? "kip" : "kN", false),
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
          .map((s) => ({ lengthMm: s.length!, angleRad: (s.angleDeg ?? 0) * PER.deg }));
      }
      return { ...v, strandLotId: v.strandLotId || null, member: v.member?.trim() || null, segments: profile };
    },
    tendonSchema,
    {},
    { segments: "Segment" },
  );
}
type FormIn = { [K in keyof ReturnType<typeof fields>]: z.input<ReturnType<typeof fields>[K]> };

/** A stored schedule row, as the edit form starts from it. */
export type StoredTendon = Omit<TendonInput, "member"> & { id: string; member: string | null };

/** A stored row as the form shows it, in the project's units; the profile as its segments. */
function valuesOf(t: StoredTendon, us: boolean): FormIn {
  const long = PER[us ? "ft" : "m"];
  const short = PER[us ? "in" : "mm"];
  return {
    tag: t.tag,
    kind: t.kind,
    strandSize: t.strandSize,
    strandCount: String(t.strandCount),
    ends: t.ends,
    jackGripMm: shown(t.jackGripMm, short),
    shopElongationMm: shown(t.shopElongationMm, short),
    strandLotId: t.strandLotId ?? "",
    member: t.member ?? "",
    jackingForceN: shown(t.jackingForceN, PER[us ? "kip" : "kN"]),
    mode: "segments",
    segments: t.segments.map((g) => ({
      length: shown(g.lengthMm, long),
      angleDeg: shown(g.angleRad, PER.deg),
    })),
    spanLength: "",
    spans: "2",
    drape: "",
  };
}

/**
 * Adds one tendon by hand: profile as segments, or as a drape height over equal spans. Given a
 * stored `tendon`, edits its schedule row instead: before an edit that judges stressed tendons
 * again is saved, its preview says how many and how many verdicts change.
 */
export function TendonForm({
  projectId,
  pourId,
  us,
  lots,
  tendon,
}: {
  projectId: string;
  pourId: string;
  us: boolean;
  lots: { id: string; lotNumber: string; strandSize: string }[];
  tendon?: StoredTendon;
}) {
  const { mutate } = useSWRConfig();
  const router = useRouter();
  const [message, setMessage] = useState<{ tone: "error" | "info"; text: string }>();
  const long = us ? "ft" : "m";
  const short = us ? "in" : "mm";
  const initial = tendon ? valuesOf(tendon, us) : undefined;
  const form = useForm<FormIn, unknown, TendonInput>({
    resolver: resolver(us),
    defaultValues: initial ?? {
      tag: "",
      kind: "unbonded_monostrand",
      strandSize: "0.5 in",
      strandCount: "1",
      ends: "A",
      jackGripMm: "",
      shopElongationMm: "",
      strandLotId: "",
      member: "",
      jackingForceN: "",
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

  const refused = (error: ApiError) => {
    const placed = placeFields(error.fields, (k) => {
      const box = k.split(".")[0]!;
      return box in fields(us) ? box : null;
    });
    for (const [k, m] of Object.entries(placed.boxes)) form.setError(k as keyof FormIn, { message: m.join(" ") });
    setMessage({ tone: "error", text: refusedWords(error, placed) });
  };
  /** Boxes left as they were shown keep the stored values to the last digit, so they move nothing. */
  const unchangedKept = (values: TendonInput): TendonInput => {
    if (!tendon || !initial) return values;
    const typed = form.getValues();
    const sameProfile =
      typed.mode === "segments" &&
      typed.segments.length === initial.segments.length &&
      typed.segments.every(
        (g, i) => g.length === initial.segments[i]!.length && g.angleDeg === initial.segments[i]!.angleDeg,
      );
    return {
      ...values,
      segments: sameProfile ? tendon.segments : values.segments,
      jackGripMm: typed.jackGripMm === initial.jackGripMm ? tendon.jackGripMm : values.jackGripMm,
      shopElongationMm:
        typed.shopElongationMm === initial.shopElongationMm ? tendon.shopElongationMm : values.shopElongationMm,
      jackingForceN:
        typed.jackingForceN === initial.jackingForceN ? (tendon.jackingForceN ?? null) : values.jackingForceN,
    };
  };
  const edit = usePreviewedEdit<TendonInput>({
    url: `/api/projects/${projectId}/tendons/${tendon?.id}`,
    what: `tendon ${tendon?.tag}`,
    refused,
    saved: (values, reevaluated) => {
      setMessage({ tone: "info", text: savedWords(`Tendon ${values.tag}`, reevaluated) });
      router.refresh();
    },
  });
  const onSubmit = form.handleSubmit(async (typed) => {
    setMessage(undefined);
    if (tendon) return edit.submit(unchangedKept(typed));
    const result = await sendJson("POST", `/api/projects/${projectId}/pours/${pourId}/tendons`, typed);
    if (!result.ok) return refused(result.error);
    setMessage({ tone: "info", text: `Tendon ${typed.tag} added.` });
    form.reset();
    void mutate(tendonsKey(projectId, pourId));
  });

  const text = (k: keyof FormIn, label: string, hint?: string) => (
    <FormField
      id={`t-${k}`}
      label={label}
      hint={hint}
      numeric={k !== "tag" && k !== "member"}
      error={err(k)}
      {...form.register(k)}
    />
  );
  const choice = (k: "kind" | "strandSize" | "ends" | "strandLotId", label: string, options: React.ReactNode) => (
    <FormField as="select" id={`t-${k}`} label={label} error={err(k)} {...form.register(k)}>
      {options}
    </FormField>
  );

  return (
    <ClientForm onSubmit={onSubmit} noValidate className="card space-y-4" aria-labelledby="t-heading">
      <h2 id="t-heading" className="text-lead font-semibold">
        {tendon ? `Edit the schedule row of ${tendon.tag}` : "Add a tendon"}
      </h2>
      {tendon && (
        <p className="text-ink-soft">
          A change of strand, profile, ends, grip, shop-drawing elongation, lot, member or jacking force judges the
          stressed tendons it touches again; you are told how many verdicts change before it is saved.
        </p>
      )}
      <FormMessage tone={message?.tone ?? "info"}>{message?.text}</FormMessage>
      <FormMessage tone="error">{form.formState.errors.root?.message}</FormMessage>
      <div className="grid gap-4 md:grid-cols-4">
        {text("tag", "Tag as drawn")}
        {choice(
          "kind",
          "Type",
          TENDON_KINDS.map((k) => (
            <option key={k} value={k}>
              {KIND_LABELS[k]}
            </option>
          )),
        )}
        {choice(
          "strandSize",
          "Strand size",
          STRAND_SIZES.map((s) => <option key={s}>{s}</option>),
        )}
        {text("strandCount", "Strands")}
        {choice(
          "ends",
          "Stressing end",
          <>
            <option value="A">A</option>
            <option value="B">B</option>
            <option value="both">Both</option>
          </>,
        )}
        {text("jackGripMm", `Jack grip, ${short}`, "Empty: the equipment set's value.")}
        {text("shopElongationMm", `Shop-drawing elongation, ${short}`, "When the detailer gives one.")}
        {text(
          "jackingForceN",
          `Jacking force, ${us ? "kip" : "kN"}`,
          "When the schedule specifies one; at most 0.80·fpu·A. Empty: the project's factor of fpu·A.",
        )}
        {text(
          "member",
          "Member",
          "The beam, slab strip or band, as drawn. Empty: the pour is its group for the group average and the wire-break ledger.",
        )}
        {choice(
          "strandLotId",
          "Strand lot",
          <>
            <option value="">None (nominal values)</option>
            {lots.map((l) => (
              <option key={l.id} value={l.id}>
                {l.lotNumber} ({l.strandSize})
              </option>
            ))}
          </>,
        )}
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
                <FormField
                  id={`seg-${i}-l`}
                  label={`Segment ${i + 1} length, ${long}`}
                  numeric
                  alsoDescribedBy={err("segments") ? "t-segments-error" : undefined}
                  {...form.register(`segments.${i}.length`)}
                />
                <FormField
                  id={`seg-${i}-a`}
                  label="Angle change, degrees"
                  numeric
                  alsoDescribedBy={err("segments") ? "t-segments-error" : undefined}
                  {...form.register(`segments.${i}.angleDeg`)}
                />
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
        <FieldError id="t-segments-error" messages={err("segments") ? [err("segments")!] : undefined} />
      </fieldset>
      <button className="btn-primary" type="submit" disabled={form.formState.isSubmitting || edit.saving}>
        {tendon ? "Save changes" : "Add tendon"}
      </button>
      {tendon && edit.dialog}
    </ClientForm>
  );
}
