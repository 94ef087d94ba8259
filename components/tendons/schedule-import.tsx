"use client";

import { FormField } from "@/components/ui/form-field";
import { useState } from "react";
import { useSWRConfig } from "swr";
import { sendJson } from "@/lib/client/send-json";
import { tendonsKey } from "./tendon-table";

/** Reads a schedule file in the browser and sends its text; lists every problem by line and column. */
export function ScheduleImport({ projectId, pourId }: { projectId: string; pourId: string }) {
  const { mutate } = useSWRConfig();
  const [busy, setBusy] = useState(false);
  const [result, setResult] = useState<
    { ok: true; text: string } | { ok: false; text: string; rows: [string, string[]][] } | null
  >(null);

  async function send(file: File) {
    setBusy(true);
    setResult(null);
    const csv = await file.text();
    const answer = await sendJson<{ imported: number }>(
      "POST",
      `/api/projects/${projectId}/pours/${pourId}/tendons/import`,
      { csv },
    );
    setBusy(false);
    if (answer.ok) {
      setResult({ ok: true, text: `${answer.data.imported} tendons imported from ${file.name}.` });
      void mutate(tendonsKey(projectId, pourId));
    } else {
      setResult({ ok: false, text: answer.error.message, rows: Object.entries(answer.error.fields ?? {}) });
    }
  }

  return (
    <section aria-labelledby="import-heading" className="card">
      <h2 id="import-heading" className="text-lead font-semibold">
        Import a schedule file
      </h2>
      <p className="mt-1">Nothing is written unless every row is good; tags already in this pour are refused.</p>
      <FormField
        id="schedule-file"
        label="Schedule CSV"
        frameClassName="mt-3"
        type="file"
        accept=".csv,text/csv"
        className="py-2"
        disabled={busy}
        onChange={(e) => {
          const f = e.currentTarget.files?.[0];
          if (f) void send(f);
          e.currentTarget.value = "";
        }}
      />
      {busy && <p role="status">Checking the file…</p>}
      {result?.ok && (
        <p role="status" className="mt-3 font-semibold">
          <span aria-hidden="true">✓ </span>
          {result.text}
        </p>
      )}
      {result && !result.ok && (
        <div role="alert" className="mt-3 rounded-md border-2 border-signal-stop bg-signal-stop-bg p-3">
          <p className="font-semibold text-signal-stop">{result.text}</p>
          {result.rows.length > 0 && (
            <table className="mt-2 w-full text-left">
              <thead>
                <tr>
                  <th className="p-1">Where</th>
                  <th className="p-1">Problem</th>
                </tr>
              </thead>
              <tbody>
                {result.rows.map(([where, messages]) => (
                  <tr key={where} className="border-t border-concrete-300">
                    <td className="whitespace-nowrap p-1 font-semibold">{where}</td>
                    <td className="p-1">{messages.join(" ")}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </div>
      )}
    </section>
  );
}
