"use client";

import { useState } from "react";
import { FormField } from "@/components/ui/form-field";
import { FieldError } from "@/components/ui/form-message";
import type { WitnessGroupView } from "@/lib/reports/daily-rows";
import { WITNESS_EXTENTS, type DailyAttestation } from "@/lib/schemas/daily-report";
import { SigningForm } from "./signing-form";

const EXTENT_BUTTONS = { full: "In full", part: "In part", none: "Not witnessed" } as const;

/** The boxes and choices the form shows, as the route names them. */
const DAILY_BOXES = (path: string) =>
  /^witness(\.\d+\.(extent|group|witnessedBy|note))?$/.test(path) ||
  ["conformance", "remarks", "signerName", "licence", "statement"].includes(path)
    ? path
    : null;

/**
 * The inspector's signature of the day's report, the same in the office and on the tablet: the
 * remarks, per pour or group stressed that day what was witnessed and by whom, the statement of
 * conformance (chosen, never preselected; "not in conformance" lists the open exceptions), the typed
 * name, licence or certification and statement, then one confirmation before the signature is
 * final. The server checks everything again and names the field of any fault.
 */
export function DailySignForm({
  api,
  day,
  nextRevision,
  groups,
  exceptions,
  previous,
  remarks,
  signerName,
  defaultStatement,
  onSigned,
  idPrefix = "daily",
}: {
  /** The day's signatures endpoint. */
  api: string;
  day: string;
  nextRevision: number;
  groups: WitnessGroupView[];
  /** The open exceptions of the day's work, in words. */
  exceptions: string[];
  /** What the last signed revision attested (the witness statements start from it). */
  previous: DailyAttestation | null;
  remarks: string;
  signerName: string;
  defaultStatement: string;
  onSigned: (revision: number) => void;
  idPrefix?: string;
}) {
  const [conformance, setConformance] = useState<string>("");
  const id = (name: string) => `${idPrefix}-${name}`;
  const before = (g: WitnessGroupView) => previous?.witness.find((w) => w.pourId === g.pourId && w.group === g.group);

  return (
    <SigningForm
      api={api}
      shown={DAILY_BOXES}
      label={`Sign the daily inspection report of ${day}`}
      className="space-y-4"
      signerId={(part) => id(`sign-${part}`)}
      signerName={signerName}
      defaultStatement={defaultStatement}
      read={(data) => {
        const value = (name: string) => String(data.get(name) ?? "");
        return {
          remarks: value("remarks"),
          // Not chosen is sent as not chosen: the server names the field.
          ...(data.get("conformance") !== null && { conformance: value("conformance") }),
          witness: groups.map((g, i) => ({
            pourId: g.pourId,
            group: g.group,
            ...(data.get(`witness.${i}.extent`) !== null && { extent: value(`witness.${i}.extent`) }),
            witnessedBy: value(`witness.${i}.witnessedBy`),
            note: value(`witness.${i}.note`),
          })),
        };
      }}
      submitLabel={`Sign revision ${nextRevision} of ${day}`}
      confirmTitle={`Sign revision ${nextRevision} of ${day}?`}
      confirmText={
        <p>
          Your typed name, licence and statement sign the day&apos;s report as it stands, with what you state was
          witnessed and{" "}
          {conformance === "not_conforming"
            ? "that the work was NOT in conformance"
            : conformance
              ? "that the work was in conformance"
              : "your statement of conformance"}
          .
        </p>
      }
      onSigned={onSigned}
    >
      {(fields) => (
        <>
          <fieldset className="space-y-3" aria-describedby={fields.witness ? id("witness-error") : undefined}>
            <legend className="text-lead font-bold">What you witnessed</legend>
            {groups.length === 0 && <p className="text-ink-soft">No tendon was stressed this day.</p>}
            <FieldError id={id("witness-error")} messages={fields.witness} />
            {groups.map((g, i) => {
              const was = before(g);
              const err = (name: string) => fields[`witness.${i}.${name}`];
              return (
                <fieldset
                  key={`${g.pourId}|${g.group}`}
                  className="space-y-2 rounded-md border border-concrete-300 p-3"
                  data-witness-group={g.label}
                >
                  <legend className="px-1 font-semibold">
                    {g.label}: {g.stressed}
                  </legend>
                  <div
                    className="flex flex-wrap gap-2"
                    role="radiogroup"
                    aria-label={`How much of ${g.label} you witnessed`}
                  >
                    {WITNESS_EXTENTS.map((extent) => (
                      <label
                        key={extent}
                        className="flex min-h-12 cursor-pointer items-center gap-2 rounded-md border-2 border-concrete-400 px-3 has-[:checked]:border-ink has-[:checked]:bg-concrete-100"
                      >
                        <input
                          type="radio"
                          name={`witness.${i}.extent`}
                          value={extent}
                          defaultChecked={was?.extent === extent}
                          className="h-5 w-5"
                        />
                        {EXTENT_BUTTONS[extent]}
                      </label>
                    ))}
                  </div>
                  <FieldError
                    id={id(`witness-${i}-extent-error`)}
                    messages={[...(err("extent") ?? []), ...(err("group") ?? [])]}
                  />
                  <div className="grid gap-2 md:grid-cols-2">
                    <FormField
                      id={id(`witness-${i}-by`)}
                      name={`witness.${i}.witnessedBy`}
                      label="Witnessed by"
                      defaultValue={was?.witnessedBy ?? signerName}
                      error={err("witnessedBy")}
                    />
                    <FormField
                      id={id(`witness-${i}-note`)}
                      name={`witness.${i}.note`}
                      label="Which part, or why not"
                      defaultValue={was?.note ?? ""}
                      error={err("note")}
                    />
                  </div>
                </fieldset>
              );
            })}
          </fieldset>

          <fieldset className="space-y-2" aria-describedby={fields.conformance ? id("conformance-error") : undefined}>
            <legend className="text-lead font-bold">Statement of conformance</legend>
            <p className="text-ink-soft">Choose one; nothing is assumed.</p>
            <div className="flex flex-wrap gap-2">
              {(
                [
                  ["conforming", "The work was in conformance"],
                  ["not_conforming", "The work was not in conformance"],
                ] as const
              ).map(([value, words]) => (
                <label
                  key={value}
                  className="flex min-h-12 cursor-pointer items-center gap-2 rounded-md border-2 border-concrete-400 px-3 has-[:checked]:border-ink has-[:checked]:bg-concrete-100"
                >
                  <input
                    type="radio"
                    name="conformance"
                    value={value}
                    className="h-5 w-5"
                    onChange={() => setConformance(value)}
                  />
                  {words}
                </label>
              ))}
            </div>
            <FieldError id={id("conformance-error")} messages={fields.conformance} />
            {exceptions.length > 0 ? (
              <div className={conformance === "not_conforming" ? "font-semibold" : "text-ink-soft"}>
                <p>
                  Open exceptions of the day&apos;s work
                  {conformance === "not_conforming" ? ", listed on the report" : ""}:
                </p>
                <ul className="list-disc pl-6" data-testid="open-exceptions">
                  {exceptions.map((x) => (
                    <li key={x}>{x}</li>
                  ))}
                </ul>
              </div>
            ) : (
              <p className="text-ink-soft">No exception of the day&apos;s work is open.</p>
            )}
          </fieldset>

          <FormField
            as="textarea"
            id={id("remarks")}
            name="remarks"
            label="Your remarks for the day"
            hint="What you observed that the records do not say: weather, access, what you asked for. Printed on the report; changing them needs a new signature."
            rows={3}
            defaultValue={remarks}
            error={fields.remarks}
          />
        </>
      )}
    </SigningForm>
  );
}
