"use client";

import { useRouter } from "next/navigation";
import { FieldError, FormMessage } from "@/components/ui/form-message";
import { sendJson } from "@/lib/client/send-json";
import { useApiCall } from "@/lib/client/use-api-call";

/** Release of one pour for tail cutting or grouting; refused by the server while anything is open. */
export function ReleaseForm({ projectId, pourId, pourName }: { projectId: string; pourId: string; pourName: string }) {
  const router = useRouter();
  const { message, fields, call } = useApiCall();
  return (
    <form
      className="mt-3 space-y-3"
      aria-label={`Release ${pourName}`}
      onSubmit={async (e) => {
        e.preventDefault();
        const statement = String(new FormData(e.currentTarget).get("statement") ?? "");
        const result = await call(sendJson("POST", `/api/projects/${projectId}/pours/${pourId}/release`, { statement }));
        if (result.ok) router.refresh();
      }}
    >
      <FormMessage tone="error">{message?.text}</FormMessage>
      <div>
        <label htmlFor={`statement-${pourId}`} className="field-label">
          Release statement
        </label>
        <textarea
          id={`statement-${pourId}`}
          name="statement"
          rows={2}
          className="field-input mt-1 py-2"
          defaultValue={`All tendons of ${pourName} are stressed and accepted; tails may be cut.`}
          aria-describedby={`statement-${pourId}-error`}
        />
        <FieldError id={`statement-${pourId}-error`} messages={fields.statement} />
      </div>
      <button type="submit" className="btn-primary">
        Release {pourName}
      </button>
    </form>
  );
}
