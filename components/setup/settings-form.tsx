"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { z } from "zod";
import { Field, FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { rejudgeMatters, rejudgeWords, type RejudgePreview } from "./edit-preview";
import { placeFields, refusedWords } from "@/lib/client/field-errors";
import { formResolver } from "@/lib/client/form-resolver";
import { sendJson } from "@/lib/client/send-json";
import { projectSettingsSchema, settingsFields, type ProjectSettings } from "@/lib/schemas/project-settings";
import { PER, shown, units } from "@/lib/client/unit-fields";
import { DEFAULT_SHIFT_ENDS, formatShiftEnd, parseShiftEnds } from "@/lib/stressing/shift";
import { ClientForm } from "@/components/ui/client-form";

type KUnit = "per ft" | "per m";

function fields(us: boolean) {
  const system = us ? "US" : "SI";
  return {
    name: z.string(),
    address: z.string(),
    unitSystem: z.enum(["us", "si"]),
    readingResolution: z.enum(["1/8in", "1/16in", "1mm"]),
    tolerancePct: units.number(),
    groupTolerancePct: units.number(false),
    shortTendonFloorMm: units.length(system, us ? "in" : "mm", false),
    comparisonBasis: z.enum(["gross", "net"]),
    countJackGrip: z.boolean(),
    frictionMu: units.number(),
    wobble: units.number(),
    wobbleUnit: z.enum(["per ft", "per m"]),
    anchorSetMm: units.length(system, us ? "in" : "mm"),
    calibrationValidityDays: units.number(),
    requiredConcreteMPa: units.pressure(system, us ? "psi" : "MPa", false),
    engineerOfRecordName: z.string(),
    engineerOfRecordEmail: z.string(),
    notifyEmails: z.string(),
    blindEntry: z.boolean(),
    releaseBy: z.enum(["engineer", "inspector"]),
    timeZone: z.string(),
    jackingForceFactor: units.number(),
    wireLossLimitPct: units.number(),
    liftoffBandPct: units.number(),
    underForcePct: units.number(),
    seatingExcessMm: units.length(system, us ? "in" : "mm"),
    clockSkewMinutes: units.number(),
    shiftEnds: z.string().transform((typed, ctx) => {
      const read = parseShiftEnds(typed);
      if ("error" in read) {
        ctx.addIssue({ code: "custom", message: read.error });
        return z.NEVER;
      }
      return read.ends;
    }),
    governing: z.enum(["tautline", "shop_drawing"]),
  };
}

function resolver(us: boolean) {
  return formResolver(
    fields(us),
    ({ wobble, wobbleUnit, shiftEnds, ...v }) => ({
      ...v,
      address: v.address?.trim() || null,
      engineerOfRecordName: v.engineerOfRecordName?.trim() || null,
      engineerOfRecordEmail: v.engineerOfRecordEmail?.trim() || null,
      notifyEmails: (v.notifyEmails ?? "").split(/[\s,;]+/).filter(Boolean),
      // K per ft × 3.2808 = K per m (1 m = 3.2808 ft).
      wobblePerM: wobble === null ? null : wobble * (wobbleUnit === "per ft" ? PER.perFt : PER.perM),
      timeZone: (v.timeZone ?? "").trim(),
      // Required boxes: units.number() has already refused an empty one.
      jackingForceFactor: v.jackingForceFactor as number,
      wireLossLimitPct: v.wireLossLimitPct as number,
      liftoffBandPct: v.liftoffBandPct as number,
      underForcePct: v.underForcePct as number,
      seatingExcessMm: v.seatingExcessMm as number,
      clockSkewMinutes: v.clockSkewMinutes as number,
      // A box that could not be read has its own message; the SI check leaves it alone.
      shiftEndMinutes: shiftEnds ?? undefined,
    }),
    projectSettingsSchema.required({
      timeZone: true,
      jackingForceFactor: true,
      wireLossLimitPct: true,
      liftoffBandPct: true,
      underForcePct: true,
      seatingExcessMm: true,
      clockSkewMinutes: true,
    }),
    { wobblePerM: "wobble", shiftEndMinutes: "shiftEnds" },
  );
}

type FormIn = { [K in keyof ReturnType<typeof fields>]: z.input<ReturnType<typeof fields>[K]> };

/** The project's computation basis and who is told; values in the project's units, stored in SI. */
export function SettingsForm({ projectId, settings }: { projectId: string; settings: ProjectSettings }) {
  const router = useRouter();
  const [message, setMessage] = useState<{ tone: "error" | "info"; text: string }>();
  const us = settings.unitSystem === "us";
  const len = us ? "in" : "mm";
  const form = useForm<FormIn, unknown, ProjectSettings>({
    resolver: resolver(us),
    defaultValues: {
      ...settingsFields(settings),
      address: settings.address ?? "",
      tolerancePct: String(settings.tolerancePct),
      groupTolerancePct: settings.groupTolerancePct === null ? "" : String(settings.groupTolerancePct),
      shortTendonFloorMm: shown(settings.shortTendonFloorMm, PER[len]),
      frictionMu: String(settings.frictionMu),
      wobble: shown(settings.wobblePerM, us ? PER.perFt : PER.perM, 6),
      wobbleUnit: us ? "per ft" : "per m",
      anchorSetMm: shown(settings.anchorSetMm, PER[len]),
      calibrationValidityDays: String(settings.calibrationValidityDays),
      requiredConcreteMPa: shown(settings.requiredConcreteMPa, PER[us ? "psi" : "MPa"], us ? 0 : 1),
      engineerOfRecordName: settings.engineerOfRecordName ?? "",
      engineerOfRecordEmail: settings.engineerOfRecordEmail ?? "",
      notifyEmails: settings.notifyEmails.join(", "),
      timeZone: settings.timeZone ?? "UTC",
      jackingForceFactor: String(settings.jackingForceFactor ?? 0.8),
      wireLossLimitPct: String(settings.wireLossLimitPct ?? 2),
      liftoffBandPct: String(settings.liftoffBandPct ?? 5),
      underForcePct: String(settings.underForcePct ?? 2),
      seatingExcessMm: shown(settings.seatingExcessMm ?? 3.175, PER[len]),
      clockSkewMinutes: String(settings.clockSkewMinutes ?? 10),
      shiftEnds: (settings.shiftEndMinutes ?? DEFAULT_SHIFT_ENDS).map(formatShiftEnd).join(", "),
      governing: settings.governing ?? "tautline",
    },
  });
  const err = (k: keyof FormIn | "wobblePerM") =>
    (form.formState.errors as Record<string, { message?: string } | undefined>)[k]?.message;
  /** A refusal's messages beside their boxes (shiftEndMinutes is typed in "Shifts end at"). */
  const refused = (error: { message: string; fields?: Record<string, string[]> }) => {
    const placed = placeFields(error.fields, (k) => {
      const box = k === "wobblePerM" ? "wobble" : k.startsWith("shiftEndMinutes") ? "shiftEnds" : k.split(".")[0]!;
      return box in fields(us) ? box : null;
    });
    for (const [k, msgs] of Object.entries(placed.boxes)) form.setError(k as keyof FormIn, { message: msgs.join(" ") });
    setMessage({ tone: "error", text: refusedWords(error, placed) });
  };

  // A change that re-judges stressed tendons is shown first and saved on a second press.
  const [confirmed, setConfirmed] = useState<string | null>(null);
  const onSubmit = form.handleSubmit(async (values) => {
    const key = JSON.stringify(values);
    if (confirmed !== key) {
      const preview = await sendJson<RejudgePreview>("POST", `/api/projects/${projectId}/settings/preview`, values);
      if (!preview.ok) return refused(preview.error);
      if (rejudgeMatters(preview.data)) {
        setConfirmed(key);
        setMessage({
          tone: "error",
          text: `${rejudgeWords(preview.data, "Saving")} Press Save settings again to confirm.`,
        });
        return;
      }
    }
    const result = await sendJson("PATCH", `/api/projects/${projectId}/settings`, values);
    if (!result.ok) return refused(result.error);
    setConfirmed(null);
    const done = result.data as { reevaluated?: number };
    setMessage({
      tone: "info",
      text: `Settings saved. New predictions use them at once${done.reevaluated ? `; ${done.reevaluated} stressed tendons were judged again` : ""}.`,
    });
    router.refresh();
  });

  return (
    <ClientForm onSubmit={onSubmit} className="space-y-6" noValidate>
      <FormMessage tone={message?.tone ?? "info"}>{message?.text}</FormMessage>
      <FormMessage tone="error">{form.formState.errors.root?.message}</FormMessage>
      <fieldset className="card grid gap-4 md:grid-cols-2">
        <legend className="px-1 text-lead font-semibold">Project</legend>
        <FormField id="s-name" label="Name" error={err("name")} {...form.register("name")} />
        <FormField id="s-address" label="Address" error={err("address")} {...form.register("address")} />
        <FormField
          as="select"
          id="s-unitSystem"
          label="Units shown"
          hint="Display only: everything is stored in SI."
          error={err("unitSystem")}
          {...form.register("unitSystem")}
        >
          <option value="us">US customary (in, ft, psi, kip)</option>
          <option value="si">SI (mm, m, MPa, kN)</option>
        </FormField>
        <FormField
          as="select"
          id="s-readingResolution"
          label="Reading division"
          error={err("readingResolution")}
          {...form.register("readingResolution")}
        >
          <option value="1/8in">1/8 in</option>
          <option value="1/16in">1/16 in</option>
          <option value="1mm">1 mm</option>
        </FormField>
      </fieldset>

      <fieldset className="card grid gap-4 md:grid-cols-3">
        <legend className="px-1 text-lead font-semibold">Tolerance rule</legend>
        <FormField
          id="s-tolerancePct"
          label="Band per tendon, ± %"
          hint="7 % is the usual building rule (ACI 318); 5 % is common on bridges."
          error={err("tolerancePct")}
          numeric
          {...form.register("tolerancePct")}
        />
        <FormField
          id="s-groupTolerancePct"
          label="Group-average band, ± % (optional)"
          error={err("groupTolerancePct")}
          numeric
          {...form.register("groupTolerancePct")}
        />
        <FormField
          id="s-shortTendonFloorMm"
          label={`Floor for short tendons, ${len} (optional)`}
          hint="The band is never narrower than this length."
          error={err("shortTendonFloorMm")}
          numeric
          {...form.register("shortTendonFloorMm")}
        />
        <FormField
          as="select"
          id="s-comparisonBasis"
          label="Usual reading method (the tablet's default)"
          hint="Each record is judged the way it was read: marks net of anchor set, ram travel gross plus the strand inside the jack."
          error={err("comparisonBasis")}
          {...form.register("comparisonBasis")}
        >
          <option value="gross">Ram travel (gross, with the strand inside the jack)</option>
          <option value="net">Marks read after lock-off (net of anchor set)</option>
        </FormField>
        <FormField
          as="select"
          id="s-governing"
          label="Elongation the verdict is judged against"
          hint="The shop drawing's value is taken as the whole tendon's, stated on the usual reading method's basis above. Both values are always shown with their difference."
          error={err("governing")}
          {...form.register("governing")}
        >
          <option value="tautline">Tautline&rsquo;s prediction</option>
          <option value="shop_drawing">Approved shop drawing (where the schedule gives one)</option>
        </FormField>
      </fieldset>

      <fieldset className="card grid gap-4 md:grid-cols-2">
        <legend className="px-1 text-lead font-semibold">Force and time</legend>
        <FormField
          id="s-jackingForceFactor"
          label="Specified jacking force, × fpu·A"
          hint="0.80 is the ACI 318 limit for buildings; 0.75 is usual on bridges. A tendon whose schedule row gives its own jacking force uses that instead."
          error={err("jackingForceFactor")}
          numeric
          {...form.register("jackingForceFactor")}
        />
        <FormField
          id="s-wireLossLimitPct"
          label="Broken wires a member may carry, % of its steel"
          hint="2 % is the ACI 318 limit for unreplaced broken prestressing steel (ACI 318-02 §18.20.4)."
          error={err("wireLossLimitPct")}
          numeric
          {...form.register("wireLossLimitPct")}
        />
        <FormField
          id="s-liftoffBandPct"
          label="Lift-off force band, ± % of the force after seating"
          hint="5 % is a common specification (UFGS 02490 uses ±5 % of lock-off)."
          error={err("liftoffBandPct")}
          numeric
          {...form.register("liftoffBandPct")}
        />
        <FormField
          id="s-underForcePct"
          label="Flag a gauge force short by more than, %"
          error={err("underForcePct")}
          numeric
          {...form.register("underForcePct")}
        />
        <FormField
          id="s-seatingExcessMm"
          label={`Flag measured seating above plan by more than, ${len}`}
          error={err("seatingExcessMm")}
          numeric
          {...form.register("seatingExcessMm")}
        />
        <FormField
          id="s-clockSkewMinutes"
          label="Mark a record whose tablet time is off the server's by more than, minutes"
          hint="The inspector sees both times on the review queue and the tendon's records."
          error={err("clockSkewMinutes")}
          numeric="integer"
          {...form.register("clockSkewMinutes")}
        />
        <FormField
          id="s-shiftEnds"
          label="Shifts end at (site time, 24-hour clock)"
          hint="One to four times, e.g. 18:00 or 06:00, 18:00. An engineer who takes a digest gets it after each."
          error={err("shiftEnds")}
          autoComplete="off"
          {...form.register("shiftEnds")}
        />
        <FormField
          id="s-timeZone"
          label="Time zone of the site"
          hint="Every date and time on the screens, the tablet, the e-mails and the reports is in this zone, and it sets the stressing day; an IANA name, e.g. America/Chicago."
          error={err("timeZone")}
          autoComplete="off"
          {...form.register("timeZone")}
        />
      </fieldset>

      <fieldset className="card grid gap-4 md:grid-cols-3">
        <legend className="px-1 text-lead font-semibold">Friction and anchor set defaults</legend>
        <FormField
          id="s-frictionMu"
          label="Curvature μ"
          error={err("frictionMu")}
          numeric
          {...form.register("frictionMu")}
        />
        <Field
          id="s-wobble"
          label="Wobble K"
          hint="Per ft × 3.2808 = per m. Check which one your data gives."
          error={err("wobble") ?? err("wobblePerM")}
        >
          {(aria) => (
            <div className="flex w-full gap-2">
              <input
                className="field-input"
                inputMode="decimal"
                autoComplete="off"
                {...aria}
                {...form.register("wobble")}
              />
              <select className="field-input w-36" aria-label="Unit of K" {...form.register("wobbleUnit")}>
                {(["per ft", "per m"] as KUnit[]).map((u) => (
                  <option key={u}>{u}</option>
                ))}
              </select>
            </div>
          )}
        </Field>
        <FormField
          id="s-anchorSetMm"
          label={`Anchor set, ${len}`}
          hint="About 1/4 in (6 mm) for monostrand, 3/8 in (10 mm) for multistrand."
          error={err("anchorSetMm")}
          numeric
          {...form.register("anchorSetMm")}
        />
      </fieldset>

      <fieldset className="card grid gap-4 md:grid-cols-3">
        <legend className="px-1 text-lead font-semibold">Before stressing</legend>
        <FormField
          id="s-calibrationValidityDays"
          label="Calibration valid for, days"
          error={err("calibrationValidityDays")}
          numeric="integer"
          {...form.register("calibrationValidityDays")}
        />
        <FormField
          id="s-requiredConcreteMPa"
          label={`Concrete strength required, ${us ? "psi" : "MPa"}`}
          error={err("requiredConcreteMPa")}
          numeric
          {...form.register("requiredConcreteMPa")}
        />
        <Field id="s-blindEntry" label="Crew sees predicted values" error={err("blindEntry")}>
          {(aria) => (
            <label className="flex min-h-touch items-center gap-3">
              <input type="checkbox" className="h-6 w-6" {...aria} {...form.register("blindEntry")} />
              Hide them until readings are entered
            </label>
          )}
        </Field>
      </fieldset>

      <fieldset className="card grid gap-4 md:grid-cols-2">
        <legend className="px-1 text-lead font-semibold">Engineer of record and e-mails</legend>
        <FormField
          id="s-engineerOfRecordName"
          label="Engineer of record"
          error={err("engineerOfRecordName")}
          {...form.register("engineerOfRecordName")}
        />
        <FormField
          id="s-engineerOfRecordEmail"
          label="Engineer of record's e-mail"
          hint="Flags are e-mailed here at once, unless this engineer chose one digest per shift (their own choice, on their Today page)."
          error={err("engineerOfRecordEmail")}
          type="email"
          {...form.register("engineerOfRecordEmail")}
        />
        <FormField
          id="s-notifyEmails"
          label="Also e-mail (commas between addresses)"
          error={err("notifyEmails")}
          {...form.register("notifyEmails")}
        />
        <FormField
          as="select"
          id="s-releaseBy"
          label="Who releases a pour"
          error={err("releaseBy")}
          {...form.register("releaseBy")}
        >
          <option value="engineer">The engineer of record</option>
          <option value="inspector">The special inspector</option>
        </FormField>
      </fieldset>
      <button type="submit" className="btn-primary" disabled={form.formState.isSubmitting}>
        {form.formState.isSubmitting ? "Saving…" : "Save settings"}
      </button>
    </ClientForm>
  );
}
