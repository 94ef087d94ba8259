"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { FieldError, FormMessage } from "@/components/ui/form-message";
import { sendJson } from "@/lib/client/send-json";
import { useApiCall } from "@/lib/client/use-api-call";
import type { FlagMailMode } from "@/lib/schemas/domain";
import { ClientForm } from "@/components/ui/client-form";

/** The engineer's own choice on one project: an e-mail for each flag, or one digest per shift. */
export function FlagMailForm(props: { projectId: string; mode: FlagMailMode; shiftEnds: string; nextEnd: string }) {
  const router = useRouter();
  const { message, fields, busy, call } = useApiCall(["mode"]);
  const [mode, setMode] = useState<FlagMailMode>(props.mode);
  const changed = mode !== props.mode;
  return (
    <ClientForm
      className="card space-y-4"
      aria-label="Flag e-mails"
      onSubmit={async (e) => {
        e.preventDefault();
        const result = await call(
          sendJson<{ mode: FlagMailMode; digestQueued: boolean }>(
            "PATCH",
            `/api/projects/${props.projectId}/flag-mail`,
            {
              mode,
            },
          ),
          (d) =>
            d.mode === "digest"
              ? `Saved. Your first digest comes after the shift that ends ${props.nextEnd}.`
              : d.digestQueued
                ? "Saved. The flags raised since your last digest are on their way in one last digest; from now on each flag comes at once."
                : "Saved. Each flag now comes in its own e-mail as it is raised.",
        );
        if (result.ok) router.refresh();
      }}
    >
      <FormMessage tone={message?.tone ?? "info"}>{message?.text}</FormMessage>
      <fieldset aria-describedby={fields.mode ? "flag-mail-error" : undefined} className="space-y-3">
        <legend className="field-label">How flags reach you on this project</legend>
        <label className="flex min-h-12 items-start gap-3 rounded-md border border-concrete-300 p-3">
          <input
            type="radio"
            name="mode"
            value="each"
            className="mt-1 size-5 shrink-0"
            checked={mode === "each"}
            onChange={() => setMode("each")}
          />
          <span>
            <span className="font-bold">One e-mail per flag</span>, as soon as the server raises it.
          </span>
        </label>
        <label className="flex min-h-12 items-start gap-3 rounded-md border border-concrete-300 p-3">
          <input
            type="radio"
            name="mode"
            value="digest"
            className="mt-1 size-5 shrink-0"
            checked={mode === "digest"}
            onChange={() => setMode("digest")}
          />
          <span>
            <span className="font-bold">One digest per shift</span>, after each shift end ({props.shiftEnds}, the
            project&apos;s time): every flag of the shift with its tendon, pour, verdict and figures. Flags that need
            action before the shift ends (tails cut on a held tendon, a member over its wire-break limit, a jacking
            force over the limit, stressing before the concrete is confirmed) still come at once as well.
          </span>
        </label>
      </fieldset>
      <FieldError id="flag-mail-error" messages={fields.mode} />
      <button type="submit" className="btn-primary" disabled={busy || !changed}>
        {busy ? "Saving…" : "Save my choice"}
      </button>
    </ClientForm>
  );
}
