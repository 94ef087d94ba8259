"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { sendJson } from "@/lib/client/send-json";
import { useApiCall } from "@/lib/client/use-api-call";
import { ClientForm } from "@/components/ui/client-form";

export interface ShareLinkView {
  id: string;
  label: string;
  createdBy: string | null;
  expires: string;
  state: "active" | "expired" | "revoked";
}

/** Makes and revokes the project's read-only links; a new link's address is shown once. */
export function ShareLinks({ projectId, links }: { projectId: string; links: ShareLinkView[] }) {
  const router = useRouter();
  const { message, fields, busy, call } = useApiCall(["label", "days"]);
  const [made, setMade] = useState<string>();
  const api = `/api/projects/${projectId}/share-links`;
  return (
    <div className="space-y-6">
      <ClientForm
        className="card space-y-3"
        aria-label="Make a read-only link"
        onSubmit={async (e) => {
          e.preventDefault();
          const data = new FormData(e.currentTarget);
          const result = await call(
            sendJson<{ url: string }>("POST", api, {
              label: String(data.get("label") ?? ""),
              days: Number(data.get("days")),
            }),
          );
          if (result.ok) {
            setMade(result.data.url);
            router.refresh();
          }
        }}
      >
        <FormMessage tone="error">{message?.text}</FormMessage>
        <div className="grid gap-3 md:grid-cols-2">
          <FormField
            id="share-label"
            name="label"
            label="Who it is for"
            placeholder="General contractor"
            error={fields.label}
          />
          <FormField
            id="share-days"
            name="days"
            type="number"
            numeric="integer"
            label="Works for (days)"
            defaultValue={30}
            error={fields.days}
          />
        </div>
        <button type="submit" className="btn-primary" disabled={busy}>
          Make link
        </button>
        {made && (
          <p role="status" className="break-all rounded-md border-2 border-ink bg-concrete-100 p-3">
            Copy this address now; it is not shown again: <span data-testid="share-url">{made}</span>
          </p>
        )}
      </ClientForm>
      <ul className="space-y-2" aria-label="Read-only links">
        {links.map((l) => (
          <li
            key={l.id}
            className="flex flex-wrap items-center justify-between gap-3 rounded-md border border-concrete-300 p-3"
          >
            <span>
              <span className="font-semibold">{l.label}</span>:{" "}
              {l.state === "active" ? `works until ${l.expires}` : l.state}
              {l.createdBy ? `, made by ${l.createdBy}` : ""}
            </span>
            {l.state === "active" && (
              <button
                type="button"
                className="btn-quiet"
                onClick={async () => {
                  const result = await call(sendJson("DELETE", `${api}/${l.id}`));
                  if (result.ok) router.refresh();
                }}
              >
                Revoke {l.label}
              </button>
            )}
          </li>
        ))}
      </ul>
    </div>
  );
}
