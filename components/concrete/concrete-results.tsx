"use client";

import { useState, type FormEvent } from "react";
import { mutate } from "swr";
import { RefreshError, useRouteData } from "@/components/setup/use-route-data";
import { FormMessage } from "@/components/ui/form-message";
import { FormField } from "@/components/ui/form-field";
import { FieldError } from "@/components/ui/form-message";
import { FileUpload } from "@/components/uploads/file-upload";
import { sendJson } from "@/lib/client/send-json";
import { useApiCall } from "@/lib/client/use-api-call";
import { formatDateTime } from "@/lib/format/dates";
import type { ConcreteGateView } from "@/lib/server/list-concrete-results";
import { formatPressure, InputError, parsePressure } from "@/lib/units";
import { ClientForm } from "@/components/ui/client-form";

/**
 * The pour's concrete strength gate: the lab's results as entered, the strength they confirm
 * (the rule in lib/stressing/concrete-strength.ts) against the project's required strength, and
 * for the inspector or the admin a form for one more set. Strength is typed in the project's
 * units (psi on a US project) and sent in MPa.
 */
export function ConcreteResults(props: {
  projectId: string;
  pourId: string;
  us: boolean;
  timeZone: string;
  canEnter: boolean;
  initial: ConcreteGateView;
}) {
  const key = `/api/projects/${props.projectId}/pours/${props.pourId}/concrete-results`;
  const { data, error } = useRouteData(key, props.initial);
  const { message, fields, busy, call } = useApiCall(["strengthMPa", "ageDays", "specimenCount", "attachmentId"]);
  const [local, setLocal] = useState<Record<string, string[]>>({});
  const [attachmentId, setAttachmentId] = useState<string | null>(null);
  const unit = props.us ? "psi" : "MPa";
  const show = (mpa: number) => formatPressure(mpa, { unit, decimals: props.us ? 0 : 1 });

  async function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = event.currentTarget;
    const values = new FormData(form);
    const errors: Record<string, string[]> = {};
    let strengthMPa = NaN;
    try {
      strengthMPa = parsePressure(String(values.get("strength") ?? ""), {
        field: "strength",
        system: props.us ? "US" : "SI",
      });
    } catch (e) {
      errors.strengthMPa = [e instanceof InputError ? e.message.replace(/^strength: /, "") : "Enter the strength."];
    }
    const whole = (name: string, what: string) => {
      const text = String(values.get(name) ?? "").trim();
      const n = Number(text);
      if (!text || !Number.isInteger(n)) errors[name] = [`Enter ${what} as a whole number.`];
      return n;
    };
    const ageDays = whole("ageDays", "the age at test in days");
    const specimenCount = whole("specimenCount", "how many specimens were broken");
    setLocal(errors);
    if (Object.keys(errors).length) return;
    const result = await call(
      sendJson("POST", key, { specimen: values.get("specimen"), strengthMPa, ageDays, specimenCount, attachmentId }),
      "Results saved.",
    );
    if (result.ok) {
      form.reset();
      setAttachmentId(null);
      await mutate(key);
    }
  }

  const err = (name: string) => [...(local[name] ?? []), ...(fields[name] ?? [])];
  const c = data.confirmed;
  return (
    <section aria-labelledby="concrete-heading" className="card space-y-4" data-testid="concrete-gate">
      <h2 id="concrete-heading" className="text-lead font-semibold">
        Concrete strength before stressing
      </h2>
      <p
        role="status"
        className={data.met || data.release ? "font-semibold" : "font-bold text-signal-stop"}
        data-met={data.met}
        data-released={Boolean(data.release)}
      >
        <span aria-hidden="true">{data.met ? "✓ " : data.release ? "" : "⚠ "}</span>
        {data.requiredMPa === null
          ? "The project sets no required strength before stressing."
          : data.met && c.strengthMPa !== null
            ? `Confirmed ${show(c.strengthMPa)} (${c.basis.toLowerCase().replace(/\.$/, "")}), at least the ${show(data.requiredMPa)} required.`
            : data.release
              ? `Released by ${data.release.by} on ${formatDateTime(data.release.at, props.timeZone)}. ` +
                (c.strengthMPa === null
                  ? `No lab result in Tautline confirms the ${show(data.requiredMPa)} required; the release stands on the engineer's statement.`
                  : `The results confirm ${show(c.strengthMPa)}, below the ${show(data.requiredMPa)} required; the release stands on the engineer's statement.`)
              : c.strengthMPa === null
                ? `Concrete not confirmed: do not stress. ${show(data.requiredMPa)} required. ${c.basis}`
                : `Concrete not confirmed: do not stress. ${show(c.strengthMPa)} (${c.basis.toLowerCase().replace(/\.$/, "")}) is below the ${show(data.requiredMPa)} required.`}
      </p>
      {data.goAheads.length > 0 && (
        <div data-testid="concrete-go-aheads">
          <p className="font-semibold">Stressed before the strength was confirmed, with the crew&apos;s reason:</p>
          <ul className="list-disc pl-6">
            {data.goAheads.map((g) => (
              <li key={`${g.tag}-${g.end}-${g.at}`}>
                {g.tag}, end {g.end}, {formatDateTime(g.at, props.timeZone)}, {g.by}: “{g.reason}”
              </li>
            ))}
          </ul>
        </div>
      )}
      <p className="text-ink-soft">
        The rule: the results at the latest test age count, averaged over every specimen; at least two specimens are
        needed.
      </p>
      <RefreshError error={error} what="concrete results" />
      {data.results.length > 0 && (
        <table className="w-full border-collapse text-left" aria-label="Concrete results">
          <thead>
            <tr className="border-b-2 border-ink">
              <th className="py-2 pr-4">Strength</th>
              <th className="py-2 pr-4">Age</th>
              <th className="py-2 pr-4">Specimens</th>
              <th className="py-2 pr-4">Lab report</th>
              <th className="py-2">Entered</th>
            </tr>
          </thead>
          <tbody>
            {data.results.map((r) => (
              <tr key={r.id} className="border-b border-concrete-300">
                <td className="py-2 pr-4">{show(r.strengthMPa)}</td>
                <td className="py-2 pr-4">{r.ageDays} days</td>
                <td className="py-2 pr-4">
                  {r.specimenCount} {r.specimen === "cube" ? "cube" : "cylinder"}
                  {r.specimenCount === 1 ? "" : "s"}
                </td>
                <td className="py-2 pr-4">
                  {r.attachmentId ? (
                    <a href={`/api/projects/${props.projectId}/attachments/${r.attachmentId}`} download>
                      Download
                    </a>
                  ) : (
                    <span className="text-ink-soft">None</span>
                  )}
                </td>
                <td className="py-2">
                  {r.enteredBy}, {formatDateTime(r.enteredAt, props.timeZone)}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {props.canEnter && (
        <ClientForm
          onSubmit={submit}
          noValidate
          className="grid gap-4 sm:grid-cols-2"
          aria-label="Enter concrete results"
        >
          {message && (
            <div className="sm:col-span-2">
              <FormMessage tone={message.tone}>{message.text}</FormMessage>
            </div>
          )}
          <fieldset className="sm:col-span-2">
            <legend className="field-label">Specimens</legend>
            <div className="mt-1 flex gap-2">
              <label className="btn-quiet has-checked:bg-ink has-checked:text-concrete-50">
                <input type="radio" name="specimen" value="cylinder" defaultChecked className="sr-only" />
                Cylinders
              </label>
              <label className="btn-quiet has-checked:bg-ink has-checked:text-concrete-50">
                <input type="radio" name="specimen" value="cube" className="sr-only" />
                Cubes
              </label>
            </div>
          </fieldset>
          <FormField
            id="concrete-strength"
            name="strength"
            label={`Average strength of the set (${unit})`}
            numeric
            error={err("strengthMPa")}
          />
          <FormField
            id="concrete-age"
            name="ageDays"
            label="Age at test (days)"
            numeric="integer"
            error={err("ageDays")}
          />
          <FormField
            id="concrete-count"
            name="specimenCount"
            label="Specimens broken"
            numeric="integer"
            error={err("specimenCount")}
          />
          <div>
            <FileUpload
              projectId={props.projectId}
              purpose="lab_report"
              label="Lab report (optional)"
              onUploaded={(f) => setAttachmentId(f.id)}
            />
            <FieldError id="concrete-attachment-error" messages={err("attachmentId")} />
          </div>
          <div className="sm:col-span-2">
            <button type="submit" className="btn-primary" disabled={busy}>
              {busy ? "Saving…" : "Save results"}
            </button>
          </div>
        </ClientForm>
      )}
    </section>
  );
}
