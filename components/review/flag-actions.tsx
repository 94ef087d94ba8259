"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { FieldError, FormMessage } from "@/components/ui/form-message";
import { TextField } from "@/components/ui/text-field";
import { sendJson } from "@/lib/client/send-json";
import { useApiCall } from "@/lib/client/use-api-call";
import { DECISION_LABELS, DECISIONS } from "@/lib/schemas/review";

interface OpenFlag {
  id: string;
  label: string;
}

/** A POST to a route handler; the page is read again when it succeeds. */
function useSubmit() {
  const router = useRouter();
  const { message, fields, busy, call } = useApiCall();
  async function submit(url: string, body: unknown, done: string): Promise<boolean> {
    const result = await call(sendJson("POST", url, body), done);
    if (result.ok) router.refresh();
    return result.ok;
  }
  return { message, fields, busy, submit };
}

function FlagPicker({ flags, id }: { flags: OpenFlag[]; id: string }) {
  return (
    <div>
      <label htmlFor={id} className="field-label">
        Flag
      </label>
      <select id={id} name="flagId" className="field-input mt-1">
        {flags.map((f) => (
          <option key={f.id} value={f.id}>
            {f.label}
          </option>
        ))}
      </select>
    </div>
  );
}

/** The inspector's findings: a note, a re-measured reading, a paperwork error, send on, close as paperwork. */
export function ReviewForm({ projectId, flags, unit }: { projectId: string; flags: OpenFlag[]; unit: "in" | "mm" }) {
  const { message, fields, busy, submit } = useSubmit();
  const [kind, setKind] = useState("note");
  if (!flags.length) return null;
  return (
    <form
      className="card space-y-4"
      aria-label="Add a finding"
      onSubmit={async (e) => {
        e.preventDefault();
        const form = e.currentTarget;
        const data = new FormData(form);
        const remeasured = Number(data.get("remeasured"));
        const body = {
          kind,
          body: String(data.get("body") ?? ""),
          ...(kind === "remeasured" ? { remeasuredMm: unit === "in" ? remeasured * 25.4 : remeasured } : {}),
        };
        if (await submit(`/api/projects/${projectId}/flags/${String(data.get("flagId"))}/reviews`, body, "Finding added to the flag's trail.")) form.reset();
      }}
    >
      <h3 className="text-lead font-bold">Add a finding</h3>
      <FormMessage tone={message?.tone ?? "info"}>{message?.text}</FormMessage>
      <FlagPicker flags={flags} id="review-flag" />
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
            <label key={value} className="flex min-h-touch items-center gap-2 rounded-md border-2 border-concrete-400 px-3">
              <input type="radio" name="kind" value={value} checked={kind === value} onChange={() => setKind(value!)} className="h-5 w-5" />
              {label}
            </label>
          ))}
        </div>
      </fieldset>
      {kind === "remeasured" && (
        <TextField
          id="remeasured"
          name="remeasured"
          inputMode="decimal"
          label={`Re-measured elongation (${unit})`}
          errors={fields.remeasuredMm}
        />
      )}
      <TextField
        id="review-body"
        name="body"
        rows={3}
        label={kind === "closed_paperwork" ? "Reason for closing" : kind === "sent_to_engineer" ? "Note for the engineer" : "What you found"}
        errors={fields.body}
      />
      <button type="submit" className="btn-primary" disabled={busy}>
        {busy ? "Saving…" : "Add to the trail"}
      </button>
    </form>
  );
}

/** The engineer of record's disposition, with written reasons and the licence statement. */
export function DispositionForm({ projectId, flags, engineerName }: { projectId: string; flags: OpenFlag[]; engineerName: string }) {
  const { message, fields, busy, submit } = useSubmit();
  if (!flags.length) return null;
  return (
    <form
      className="card space-y-4 border-2 border-ink"
      aria-label="Record a disposition"
      onSubmit={async (e) => {
        e.preventDefault();
        const form = e.currentTarget;
        const data = new FormData(form);
        const body = {
          decision: String(data.get("decision") ?? ""),
          reasons: String(data.get("reasons") ?? ""),
          licenceStatement: String(data.get("licence") ?? ""),
        };
        if (await submit(`/api/projects/${projectId}/flags/${String(data.get("flagId"))}/dispositions`, body, "Disposition recorded.")) form.reset();
      }}
    >
      <h3 className="text-lead font-bold">Decision of the engineer of record</h3>
      <FormMessage tone={message?.tone ?? "info"}>{message?.text}</FormMessage>
      <FlagPicker flags={flags} id="disposition-flag" />
      <fieldset>
        <legend className="field-label">Disposition</legend>
        <div className="mt-1 grid gap-2 sm:grid-cols-2">
          {DECISIONS.map((d) => (
            <label key={d} className="flex min-h-touch items-center gap-2 rounded-md border-2 border-concrete-400 px-3">
              <input type="radio" name="decision" value={d} className="h-5 w-5" />
              {DECISION_LABELS[d]}
            </label>
          ))}
        </div>
        <FieldError id="decision-error" messages={fields.decision} />
      </fieldset>
      <TextField id="reasons" name="reasons" rows={4} label="Reasons" errors={fields.reasons} />
      <TextField
        id="licence"
        name="licence"
        placeholder="Licensed professional engineer, jurisdiction and number"
        label={`Licence statement of ${engineerName}`}
        errors={fields.licenceStatement}
      />
      <button type="submit" className="btn-primary" disabled={busy}>
        {busy ? "Recording…" : "Record the disposition"}
      </button>
    </form>
  );
}

/** A paperwork correction: a new revision of the record with the right value and the reason. */
export function CorrectionForm({ projectId, recordId, unit }: { projectId: string; recordId: string; unit: "in" | "mm" }) {
  const { message, fields, busy, submit } = useSubmit();
  const [open, setOpen] = useState(false);
  if (!open) {
    return (
      <button type="button" className="btn-quiet" onClick={() => setOpen(true)}>
        Correct paperwork
      </button>
    );
  }
  return (
    <form
      className="mt-2 space-y-3 rounded-md border-2 border-concrete-400 p-3"
      aria-label="Correct this record"
      onSubmit={async (e) => {
        e.preventDefault();
        const data = new FormData(e.currentTarget);
        const value = Number(data.get("measured"));
        await submit(
          `/api/projects/${projectId}/records/${recordId}/corrections`,
          { reason: String(data.get("reason") ?? ""), measuredMm: unit === "in" ? value * 25.4 : value },
          "Corrected as a new revision and evaluated again.",
        );
      }}
    >
      <FormMessage tone={message?.tone ?? "info"}>{message?.text}</FormMessage>
      <TextField
        id={`measured-${recordId}`}
        name="measured"
        inputMode="decimal"
        label={`Correct elongation (${unit})`}
        errors={fields.measuredMm}
      />
      <TextField id={`reason-${recordId}`} name="reason" label="Why the record was wrong" errors={fields.reason} />
      <button type="submit" className="btn-primary" disabled={busy}>
        Save the correction
      </button>
    </form>
  );
}
