"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { z } from "zod";
import { FormMessage } from "@/components/ui/form-message";
import { formResolver } from "@/lib/client/form-resolver";
import { sendJson } from "@/lib/client/send-json";
import { projectSettingsSchema, settingsFields, type ProjectSettings } from "@/lib/schemas/project-settings";
import { PER, shown, units } from "@/lib/client/unit-fields";
import { DEFAULT_SHIFT_ENDS, formatShiftEnd, parseShiftEnds } from "@/lib/stressing/shift";
import { METRES_PER_FOOT } from "@/lib/units";

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
      wobblePerM: wobble === null ? null : wobbleUnit === "per ft" ? wobble / METRES_PER_FOOT : wobble,
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

const Row = ({
  id,
  label,
  hint,
  error,
  children,
}: {
  id: string;
  label: string;
  hint?: string;
  error?: string;
  children: React.ReactNode;
}) => (
  <div>
    <label htmlFor={id} className="field-label">
      {label}
    </label>
    <div className="mt-1">{children}</div>
    {hint && <p className="mt-1 text-label text-ink-faint">{hint}</p>}
    {error && (
      <p id={`${id}-error`} className="mt-1 font-semibold text-signal-stop">
        {error}
      </p>
    )}
  </div>
);

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
      wobble: us ? shown(settings.wobblePerM * METRES_PER_FOOT, 1, 6) : shown(settings.wobblePerM, 1, 6),
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
  const reg = (k: keyof FormIn) => ({
    id: `s-${k}`,
    "aria-invalid": err(k) ? true : undefined,
    "aria-describedby": err(k) ? `s-${k}-error` : undefined,
    ...form.register(k),
  });

  // A change that re-judges stressed tendons is shown first and saved on a second press.
  const [confirmed, setConfirmed] = useState<string | null>(null);
  const onSubmit = form.handleSubmit(async (values) => {
    const key = JSON.stringify(values);
    if (confirmed !== key) {
      const preview = await sendJson<{ stressed: number; verdictsChanging: number; tags: string[] }>(
        "POST",
        `/api/projects/${projectId}/settings/preview`,
        values,
      );
      if (!preview.ok) {
        for (const [k, msgs] of Object.entries(preview.error.fields ?? {}))
          form.setError(k as keyof FormIn, { message: msgs.join(" ") });
        setMessage({ tone: "error", text: preview.error.message });
        return;
      }
      if (preview.data.verdictsChanging > 0) {
        setConfirmed(key);
        setMessage({
          tone: "error",
          text: `Saving judges the ${preview.data.stressed} stressed tendons again; ${preview.data.verdictsChanging} verdict${preview.data.verdictsChanging > 1 ? "s" : ""} change (${preview.data.tags.slice(0, 12).join(", ")}${preview.data.tags.length > 12 ? ", …" : ""}). Press Save settings again to confirm.`,
        });
        return;
      }
    }
    const result = await sendJson("PATCH", `/api/projects/${projectId}/settings`, values);
    if (!result.ok) {
      for (const [k, msgs] of Object.entries(result.error.fields ?? {}))
        form.setError((k === "wobblePerM" ? "wobble" : k in fields(us) ? k : "root") as keyof FormIn, {
          message: msgs.join(" "),
        });
      setMessage({ tone: "error", text: result.error.message });
      return;
    }
    setConfirmed(null);
    const done = result.data as { reevaluated?: number };
    setMessage({
      tone: "info",
      text: `Settings saved. New predictions use them at once${done.reevaluated ? `; ${done.reevaluated} stressed tendons were judged again` : ""}.`,
    });
    router.refresh();
  });

  return (
    <form onSubmit={onSubmit} className="space-y-6" noValidate>
      <FormMessage tone={message?.tone ?? "info"}>{message?.text}</FormMessage>
      <FormMessage tone="error">{form.formState.errors.root?.message}</FormMessage>
      <fieldset className="card grid gap-4 md:grid-cols-2">
        <legend className="px-1 text-lead font-semibold">Project</legend>
        <Row id="s-name" label="Name" error={err("name")}>
          <input className="field-input" {...reg("name")} />
        </Row>
        <Row id="s-address" label="Address" error={err("address")}>
          <input className="field-input" {...reg("address")} />
        </Row>
        <Row
          id="s-unitSystem"
          label="Units shown"
          hint="Display only: everything is stored in SI."
          error={err("unitSystem")}
        >
          <select className="field-input" {...reg("unitSystem")}>
            <option value="us">US customary (in, ft, psi, kip)</option>
            <option value="si">SI (mm, m, MPa, kN)</option>
          </select>
        </Row>
        <Row id="s-readingResolution" label="Reading division" error={err("readingResolution")}>
          <select className="field-input" {...reg("readingResolution")}>
            <option value="1/8in">1/8 in</option>
            <option value="1/16in">1/16 in</option>
            <option value="1mm">1 mm</option>
          </select>
        </Row>
      </fieldset>

      <fieldset className="card grid gap-4 md:grid-cols-3">
        <legend className="px-1 text-lead font-semibold">Tolerance rule</legend>
        <Row
          id="s-tolerancePct"
          label="Band per tendon, ± %"
          hint="7 % is the usual building rule (ACI 318); 5 % is common on bridges."
          error={err("tolerancePct")}
        >
          <input className="field-input" inputMode="decimal" {...reg("tolerancePct")} />
        </Row>
        <Row id="s-groupTolerancePct" label="Group-average band, ± % (optional)" error={err("groupTolerancePct")}>
          <input className="field-input" inputMode="decimal" {...reg("groupTolerancePct")} />
        </Row>
        <Row
          id="s-shortTendonFloorMm"
          label={`Floor for short tendons, ${len} (optional)`}
          hint="The band is never narrower than this length."
          error={err("shortTendonFloorMm")}
        >
          <input className="field-input" inputMode="decimal" {...reg("shortTendonFloorMm")} />
        </Row>
        <Row
          id="s-comparisonBasis"
          label="Usual reading method (the tablet's default)"
          hint="Each record is judged the way it was read: marks net of anchor set, ram travel gross plus the strand inside the jack."
          error={err("comparisonBasis")}
        >
          <select className="field-input" {...reg("comparisonBasis")}>
            <option value="gross">Ram travel (gross, with the strand inside the jack)</option>
            <option value="net">Marks read after lock-off (net of anchor set)</option>
          </select>
        </Row>
        <Row
          id="s-governing"
          label="Elongation the verdict is judged against"
          hint="The shop drawing's value is taken as the whole tendon's, stated on the usual reading method's basis above. Both values are always shown with their difference."
          error={err("governing")}
        >
          <select className="field-input" {...reg("governing")}>
            <option value="tautline">Tautline&rsquo;s prediction</option>
            <option value="shop_drawing">Approved shop drawing (where the schedule gives one)</option>
          </select>
        </Row>
      </fieldset>

      <fieldset className="card grid gap-4 md:grid-cols-2">
        <legend className="px-1 text-lead font-semibold">Force and time</legend>
        <Row
          id="s-jackingForceFactor"
          label="Specified jacking force, × fpu·A"
          hint="0.80 is the ACI 318 limit for buildings; 0.75 is usual on bridges."
          error={err("jackingForceFactor")}
        >
          <input className="field-input" inputMode="decimal" {...reg("jackingForceFactor")} />
        </Row>
        <Row
          id="s-wireLossLimitPct"
          label="Broken wires a member may carry, % of its steel"
          hint="2 % is the ACI 318 limit for unreplaced broken prestressing steel (ACI 318-02 §18.20.4)."
          error={err("wireLossLimitPct")}
        >
          <input className="field-input" inputMode="decimal" {...reg("wireLossLimitPct")} />
        </Row>
        <Row
          id="s-liftoffBandPct"
          label="Lift-off force band, ± % of the force after seating"
          hint="5 % is a common specification (UFGS 02490 uses ±5 % of lock-off)."
          error={err("liftoffBandPct")}
        >
          <input className="field-input" inputMode="decimal" {...reg("liftoffBandPct")} />
        </Row>
        <Row id="s-underForcePct" label="Flag a gauge force short by more than, %" error={err("underForcePct")}>
          <input className="field-input" inputMode="decimal" {...reg("underForcePct")} />
        </Row>
        <Row
          id="s-seatingExcessMm"
          label={`Flag measured seating above plan by more than, ${len}`}
          error={err("seatingExcessMm")}
        >
          <input className="field-input" inputMode="decimal" {...reg("seatingExcessMm")} />
        </Row>
        <Row
          id="s-clockSkewMinutes"
          label="Mark a record whose tablet time is off the server's by more than, minutes"
          hint="The inspector sees both times on the review queue and the tendon's records."
          error={err("clockSkewMinutes")}
        >
          <input className="field-input" inputMode="numeric" {...reg("clockSkewMinutes")} />
        </Row>
        <Row
          id="s-shiftEnds"
          label="Shifts end at (site time, 24-hour clock)"
          hint="One to four times, e.g. 18:00 or 06:00, 18:00. An engineer who takes a digest gets it after each."
          error={err("shiftEnds")}
        >
          <input className="field-input" autoComplete="off" {...reg("shiftEnds")} />
        </Row>
        <Row
          id="s-timeZone"
          label="Time zone of the site"
          hint="Every date and time on the screens, the tablet, the e-mails and the reports is in this zone, and it sets the stressing day; an IANA name, e.g. America/Chicago."
          error={err("timeZone")}
        >
          <input className="field-input" autoComplete="off" {...reg("timeZone")} />
        </Row>
      </fieldset>

      <fieldset className="card grid gap-4 md:grid-cols-3">
        <legend className="px-1 text-lead font-semibold">Friction and anchor set defaults</legend>
        <Row id="s-frictionMu" label="Curvature μ" error={err("frictionMu")}>
          <input className="field-input" inputMode="decimal" {...reg("frictionMu")} />
        </Row>
        <Row
          id="s-wobble"
          label="Wobble K"
          hint="Per ft × 3.2808 = per m. Check which one your data gives."
          error={err("wobble") ?? err("wobblePerM")}
        >
          <div className="flex gap-2">
            <input className="field-input" inputMode="decimal" {...reg("wobble")} />
            <select className="field-input w-36" aria-label="Unit of K" {...form.register("wobbleUnit")}>
              {(["per ft", "per m"] as KUnit[]).map((u) => (
                <option key={u}>{u}</option>
              ))}
            </select>
          </div>
        </Row>
        <Row
          id="s-anchorSetMm"
          label={`Anchor set, ${len}`}
          hint="About 1/4 in (6 mm) for monostrand, 3/8 in (10 mm) for multistrand."
          error={err("anchorSetMm")}
        >
          <input className="field-input" inputMode="decimal" {...reg("anchorSetMm")} />
        </Row>
      </fieldset>

      <fieldset className="card grid gap-4 md:grid-cols-3">
        <legend className="px-1 text-lead font-semibold">Before stressing</legend>
        <Row id="s-calibrationValidityDays" label="Calibration valid for, days" error={err("calibrationValidityDays")}>
          <input className="field-input" inputMode="numeric" {...reg("calibrationValidityDays")} />
        </Row>
        <Row
          id="s-requiredConcreteMPa"
          label={`Concrete strength required, ${us ? "psi" : "MPa"}`}
          error={err("requiredConcreteMPa")}
        >
          <input className="field-input" inputMode="decimal" {...reg("requiredConcreteMPa")} />
        </Row>
        <Row id="s-blindEntry" label="Crew sees predicted values">
          <label className="flex min-h-touch items-center gap-3">
            <input type="checkbox" className="h-6 w-6" {...form.register("blindEntry")} id="s-blindEntry" />
            Hide them until readings are entered
          </label>
        </Row>
      </fieldset>

      <fieldset className="card grid gap-4 md:grid-cols-2">
        <legend className="px-1 text-lead font-semibold">Engineer of record and e-mails</legend>
        <Row id="s-engineerOfRecordName" label="Engineer of record" error={err("engineerOfRecordName")}>
          <input className="field-input" {...reg("engineerOfRecordName")} />
        </Row>
        <Row
          id="s-engineerOfRecordEmail"
          label="Engineer of record's e-mail"
          hint="Flags are e-mailed here at once, unless this engineer chose one digest per shift (their own choice, on their Today page)."
          error={err("engineerOfRecordEmail")}
        >
          <input className="field-input" type="email" {...reg("engineerOfRecordEmail")} />
        </Row>
        <Row id="s-notifyEmails" label="Also e-mail (commas between addresses)" error={err("notifyEmails")}>
          <input className="field-input" {...reg("notifyEmails")} />
        </Row>
        <Row id="s-releaseBy" label="Who releases a pour" error={err("releaseBy")}>
          <select className="field-input" {...reg("releaseBy")}>
            <option value="engineer">The engineer of record</option>
            <option value="inspector">The special inspector</option>
          </select>
        </Row>
      </fieldset>
      <button type="submit" className="btn-primary" disabled={form.formState.isSubmitting}>
        {form.formState.isSubmitting ? "Saving…" : "Save settings"}
      </button>
    </form>
  );
}
