"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { FieldError, FormMessage } from "@/components/ui/form-message";
import { FormField } from "@/components/ui/form-field";
import { FractionKeysFor } from "@/components/ui/fraction-keys";
import { sendJson } from "@/lib/client/send-json";
import { useApiCall, type Shown } from "@/lib/client/use-api-call";
import { DECISIONS } from "@/lib/schemas/domain";
import { DECISION_LABELS } from "@/lib/schemas/review";
import { isInputError, parseLength } from "@/lib/units";
import { ClientForm } from "@/components/ui/client-form";

interface OpenFlag {
  id: string;
  label: string;
}

/** A POST to a route handler; the page is read again when it succeeds. */
function useSubmit(shown: Shown) {
  const router = useRouter();
  const { message, fields, busy, call } = useApiCall(shown);
  async function submit(url: string, body: unknown, done: string): Promise<boolean> {
    const result = await call(sendJson("POST", url, body), done);
    if (result.ok) router.refresh();
    return result.ok;
  }
  return { message, fields, busy, submit };
}

/**
 * A length as the crew would type it ("7 1/8", "7.125 in", "181 mm"), read by lib/units like the
 * field log reads it; a bare number is in the project's unit. Answers millimetres or the message
 * to show beside the box.
 */
function readLength(text: string, unit: "in" | "mm", field: string): { mm: number } | { error: string } {
  if (!text.trim()) return { error: "Type the elongation, for example 7 1/8 or 181 mm." };
  try {
    return { mm: parseLength(text, { field, system: unit === "in" ? "US" : "SI", defaultUnit: unit }) };
  } catch (error) {
    return { error: isInputError(error) ? error.message.replace(/^[^:]*: /, "") : "Type the elongation as a number." };
  }
}

/** What a length box takes, as the field log takes it. */
const LENGTH_HINT = {
  in: "Decimals, fractions or feet and inches, as on the field log: 7 1/8, 7.125, 181 mm.",
  mm: "Millimetres, or with a unit: 181, 18.1 cm, 7 1/8 in.",
} as const;

/**
 * The flag a form acts on. `selected` is the flag the page opened on; an empty string means the
 * link named a flag that is no longer open, so nothing is chosen for the person: they pick one.
 */
function FlagPicker({
  flags,
  id,
  selected,
  errors,
}: {
  flags: OpenFlag[];
  id: string;
  selected?: string;
  errors?: string[];
}) {
  const chosen = selected === "" ? "" : selected && flags.some((f) => f.id === selected) ? selected : flags[0]?.id;
  // One open flag and nothing against choosing it: nothing to choose, so it is named, not offered.
  if (flags.length === 1 && chosen)
    return (
      <p>
        <span className="text-label font-semibold uppercase text-ink-faint">Flag: </span>
        <input type="hidden" id={id} name="flagId" value={flags[0]!.id} />
        {flags[0]!.label}
      </p>
    );
  return (
    <FormField as="select" id={id} name="flagId" label="Flag" defaultValue={chosen} error={errors}>
      {chosen === "" && (
        <option value="" disabled>
          Choose the flag
        </option>
      )}
      {flags.map((f) => (
        <option key={f.id} value={f.id}>
          {f.label}
        </option>
      ))}
    </FormField>
  );
}

/** The chosen flag's id, or the words to show beside the picker when none is chosen. */
function chosenFlag(data: FormData): { id: string } | { error: string[] } {
  const id = String(data.get("flagId") ?? "");
  return id ? { id } : { error: ["Choose the flag this is about."] };
}

/** The inspector's findings: a note, a re-measured reading, a paperwork error, send on, close as paperwork. */
export function ReviewForm({
  projectId,
  flags,
  unit,
  selected,
}: {
  projectId: string;
  flags: OpenFlag[];
  unit: "in" | "mm";
  selected?: string;
}) {
  const { message, fields, busy, submit } = useSubmit(["remeasuredMm", "body"]);
  const [kind, setKind] = useState("note");
  const [lengthError, setLengthError] = useState<string[]>();
  const [flagError, setFlagError] = useState<string[]>();
  if (!flags.length) return null;
  return (
    <ClientForm
      className="card space-y-4"
      aria-label="Add a finding"
      onSubmit={async (e) => {
        e.preventDefault();
        const form = e.currentTarget;
        const data = new FormData(form);
        // A reading the parser refuses is not sent; the server still checks the rest, so every
        // message shows at once, the reading's own beside its box.
        const read =
          kind === "remeasured" ? readLength(String(data.get("remeasured") ?? ""), unit, "remeasuredMm") : null;
        setLengthError(read && "error" in read ? [read.error] : undefined);
        const flag = chosenFlag(data);
        setFlagError("error" in flag ? flag.error : undefined);
        if ("error" in flag) return;
        const body = {
          kind,
          body: String(data.get("body") ?? ""),
          ...(read && "mm" in read ? { remeasuredMm: read.mm } : {}),
        };
        if (
          await submit(
            `/api/projects/${projectId}/flags/${flag.id}/reviews`,
            body,
            "Finding added to the flag's trail.",
          )
        )
          form.reset();
      }}
    >
      <h3 className="text-lead font-bold">Add a finding</h3>
      <FormMessage tone={message?.tone ?? "info"}>{message?.text}</FormMessage>
      <FlagPicker flags={flags} id="review-flag" selected={selected} errors={flagError} />
      <fieldset>
        <legend className="field-label">Finding</legend>
        <div className="mt-1 flex flex-wrap gap-2">
          {[
            ["note", "Note"],
            ["remeasured", "Re-measured reading"],
            ["paperwork_error", "Paperwork error found"],
            ["sent_to_engineer", "Send to the engineer"],
            ["closed_paperwork", "Close as paperwork"],
          ].map(([value, label]) => (
            <label
              key={value}
              className="flex min-h-touch items-center gap-2 rounded-md border-2 border-concrete-400 px-3"
            >
              <input
                type="radio"
                name="kind"
                value={value}
                checked={kind === value}
                onChange={() => setKind(value!)}
                className="h-5 w-5"
              />
              {label}
            </label>
          ))}
        </div>
      </fieldset>
      {kind === "remeasured" && (
        <div className="space-y-2">
          <FormField
            id="remeasured"
            name="remeasured"
            numeric
            placeholder={unit === "in" ? "e.g. 7 1/8" : "e.g. 181"}
            label={`Re-measured elongation (${unit})`}
            hint={LENGTH_HINT[unit]}
            error={lengthError ?? fields.remeasuredMm}
          />
          {unit === "in" && <FractionKeysFor boxId="remeasured" target="Re-measured elongation" />}
        </div>
      )}
      <FormField
        as="textarea"
        id="review-body"
        name="body"
        rows={3}
        label={
          kind === "closed_paperwork"
            ? "Reason for closing"
            : kind === "sent_to_engineer"
              ? "Note for the engineer"
              : "What you found"
        }
        error={fields.body}
      />
      <button type="submit" className="btn-primary" disabled={busy}>
        {busy ? "Saving…" : "Add to the trail"}
      </button>
    </ClientForm>
  );
}

/** The engineer of record's disposition, with written reasons and the licence statement. */
export function DispositionForm({
  projectId,
  flags,
  engineerName,
  selected,
}: {
  projectId: string;
  flags: OpenFlag[];
  engineerName: string;
  selected?: string;
}) {
  const { message, fields, busy, submit } = useSubmit(["decision", "reasons", "licenceStatement"]);
  const [flagError, setFlagError] = useState<string[]>();
  if (!flags.length) return null;
  return (
    <ClientForm
      className="card space-y-3 border-2 border-ink"
      aria-label="Record a disposition"
      onSubmit={async (e) => {
        e.preventDefault();
        const form = e.currentTarget;
        const data = new FormData(form);
        const flag = chosenFlag(data);
        setFlagError("error" in flag ? flag.error : undefined);
        if ("error" in flag) return;
        const body = {
          decision: String(data.get("decision") ?? ""),
          reasons: String(data.get("reasons") ?? ""),
          licenceStatement: String(data.get("licence") ?? ""),
        };
        if (await submit(`/api/projects/${projectId}/flags/${flag.id}/dispositions`, body, "Disposition recorded."))
          form.reset();
      }}
    >
      <h3 className="text-lead font-bold">Decision of the engineer of record</h3>
      <FormMessage tone={message?.tone ?? "info"}>{message?.text}</FormMessage>
      <FlagPicker flags={flags} id="disposition-flag" selected={selected} errors={flagError} />
      <fieldset>
        <legend className="field-label">Disposition</legend>
        <div className="mt-1 grid gap-2 sm:grid-cols-3" aria-describedby="decision-error">
          {DECISIONS.map((d) => (
            <label
              key={d}
              className="flex min-h-touch items-center gap-2 rounded-md border-2 border-concrete-400 px-3 py-1 leading-tight"
            >
              <input type="radio" name="decision" value={d} className="h-5 w-5 shrink-0" />
              {DECISION_LABELS[d]}
            </label>
          ))}
        </div>
        <FieldError id="decision-error" messages={fields.decision} />
      </fieldset>
      <FormField as="textarea" id="reasons" name="reasons" rows={2} label="Reasons" error={fields.reasons} />
      <FormField
        id="licence"
        name="licence"
        placeholder="Licensed professional engineer, jurisdiction and number"
        label={`Licence statement of ${engineerName}`}
        error={fields.licenceStatement}
      />
      <button type="submit" className="btn-primary" disabled={busy}>
        {busy ? "Recording…" : "Record the disposition"}
      </button>
    </ClientForm>
  );
}

/** A paperwork correction: a new revision of the record with the right value and the reason. */
export function CorrectionForm({
  projectId,
  recordId,
  unit,
}: {
  projectId: string;
  recordId: string;
  unit: "in" | "mm";
}) {
  const { message, fields, busy, submit } = useSubmit(["measuredMm", "reason"]);
  const [open, setOpen] = useState(false);
  const [lengthError, setLengthError] = useState<string[]>();
  if (!open) {
    return (
      <button type="button" className="btn-quiet" onClick={() => setOpen(true)}>
        Correct paperwork
      </button>
    );
  }
  return (
    <ClientForm
      className="mt-2 space-y-3 rounded-md border-2 border-concrete-400 p-3"
      aria-label="Correct this record"
      onSubmit={async (e) => {
        e.preventDefault();
        const data = new FormData(e.currentTarget);
        const read = readLength(String(data.get("measured") ?? ""), unit, "measuredMm");
        setLengthError("error" in read ? [read.error] : undefined);
        await submit(
          `/api/projects/${projectId}/records/${recordId}/corrections`,
          { reason: String(data.get("reason") ?? ""), ...("mm" in read ? { measuredMm: read.mm } : {}) },
          "Corrected as a new revision and evaluated again.",
        );
      }}
    >
      <FormMessage tone={message?.tone ?? "info"}>{message?.text}</FormMessage>
      <FormField
        id={`measured-${recordId}`}
        name="measured"
        numeric
        label={`Correct elongation (${unit})`}
        hint={LENGTH_HINT[unit]}
        error={lengthError ?? fields.measuredMm}
      />
      {unit === "in" && <FractionKeysFor boxId={`measured-${recordId}`} target="Correct elongation" />}
      <FormField id={`reason-${recordId}`} name="reason" label="Why the record was wrong" error={fields.reason} />
      <button type="submit" className="btn-primary" disabled={busy}>
        Save the correction
      </button>
    </ClientForm>
  );
}
