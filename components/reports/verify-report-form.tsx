"use client";

import { FormField } from "@/components/ui/form-field";
import { useState } from "react";
import { FormMessage } from "@/components/ui/form-message";
import { sendJson } from "@/lib/client/send-json";
import { formatDateTime } from "@/lib/format/dates";
import { ClientForm } from "@/components/ui/client-form";
import type { Verification } from "@/lib/server/verify-report-file";

type Answer = Verification<string>;

async function sha256Hex(file: File): Promise<string> {
  const digest = await crypto.subtle.digest("SHA-256", await file.arrayBuffer());
  return [...new Uint8Array(digest)].map((b) => b.toString(16).padStart(2, "0")).join("");
}

/** Hashes the chosen file in the browser and says whether it is a signed revision, and which. */
export function VerifyReportForm() {
  const [answer, setAnswer] = useState<{ tone: "error" | "info"; text: string }>();
  const [busy, setBusy] = useState(false);
  return (
    <ClientForm className="space-y-3" aria-label="Check a report file" onSubmit={(e) => e.preventDefault()}>
      <FormField
        id="report-file"
        label="Report file (PDF)"
        type="file"
        accept="application/pdf"
        className="py-2"
        disabled={busy}
        onChange={async (e) => {
          const file = e.currentTarget.files?.[0];
          if (!file) return;
          setBusy(true);
          const sha256 = await sha256Hex(file);
          const result = await sendJson<Answer>("POST", "/api/report-verifications", { sha256 });
          setBusy(false);
          if (!result.ok) return setAnswer({ tone: "error", text: result.error.message });
          const a = result.data;
          if (!a.match)
            return setAnswer({
              tone: "error",
              text: `Not a signed revision. No signed report has exactly this content (sha256 ${sha256}). It may be an unsigned copy or it was changed after signing.`,
            });
          const what = a.pour ? `the stressing report of ${a.pour}` : `the inspection report of ${a.day}`;
          setAnswer({
            tone: a.latest ? "info" : "error",
            text:
              `Matches revision ${a.revision} of ${what}, ${a.project}, signed by ${a.signerName} (${a.licence}) on ${formatDateTime(a.signedAt, "UTC")}. ` +
              (a.latest
                ? "It is the latest signed revision."
                : `Superseded: revision ${a.supersededBy ?? "a later one"} has been signed since; ask for the current one.`),
          });
        }}
      />
      <FormMessage tone={answer?.tone ?? "info"}>{busy ? "Checking…" : answer?.text}</FormMessage>
    </ClientForm>
  );
}
