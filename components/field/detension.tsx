"use client";
import { FormField } from "@/components/ui/form-field";
import { useId, useState } from "react";
import { formatDateTime, instantFromLocalInput, localInputValue, projectTimeZone } from "@/lib/format/dates";
import { pressureAsTyped } from "@/lib/format/quantities";
import { readMeta, type LocalDetension, type SessionMeta } from "@/lib/offline/db";
import { awaitingRestressOf, type Hold } from "@/lib/offline/hold-view";
import { saveDetension } from "@/lib/offline/outbox";
import { detensionPayloadSchema, type DetensionPayload } from "@/lib/schemas/detension";
import { entryUnitsFor } from "@/lib/schemas/record";
import type { FieldProject, FieldTendon } from "@/lib/schemas/sync";
import { zodFields } from "@/lib/schemas/zod-fields";
import { isInputError, parsePressure } from "@/lib/units";
import {
  type FollowUpOrder,
  type FollowUpNames,
  FollowUpActions,
  FollowUpPanel,
  FormProblem,
  SetChoice,
  saveFailure,
} from "./follow-up-fields";
import { useField } from "./field-provider";
import { useLiveQuery as useLive } from "dexie-react-hooks";
import { ClientForm } from "@/components/ui/client-form";

/**
 * The detension an engineer ordered (decision detension_restress), opened from the hold panel:
 * when, who ran the jack, the equipment set, the gauge pressure at release when it was read, how
 * many strands were released, and remarks. Saved on the tablet with its outbox op and sent with
 * the next sync. Once recorded, the tendon stays held ("detensioned: restress required") until a
 * stressing record made after it has been logged at every end it is stressed from.
 */

type Field = "detensionedAt" | "operatorName" | "equipmentSetId" | "pressure" | "strandsDetensioned" | "remarks";
const FIELDS: readonly string[] = [
  "detensionedAt",
  "operatorName",
  "equipmentSetId",
  "pressure",
  "strandsDetensioned",
  "remarks",
];
/** The boxes typed into, and the field of the payload each one's problem belongs to. */
type Box = "when" | "operator" | "pressure" | "strands" | "remarks";
const BOX_FIELD: Record<Box, Field> = {
  when: "detensionedAt",
  operator: "operatorName",
  pressure: "pressure",
  strands: "strandsDetensioned",
  remarks: "remarks",
};
/** A tablet clock a little ahead of the server is no fault; the server allows the same. */
const FUTURE_SLACK_MS = 10 * 60 * 1000;

const DETENSION: FollowUpNames = {
  title: "Detension",
  what: "the detension",
  testId: "detension",
  openTestId: "detension-open",
};

export function DetensionPanel({ tendon, hold }: { tendon: FieldTendon; hold: Hold }) {
  const { db } = useField();
  const dispositionId = hold.decision?.id;
  const data = useLive(async () => {
    const [project, sets, detensions, records, session] = await Promise.all([
      db.projects.get(tendon.projectId),
      db.equipmentSets.where("projectId").equals(tendon.projectId).sortBy("name"),
      db.detensions.where("tendonId").equals(tendon.id).sortBy("detensionedAt"),
      db.records.where("tendonId").equals(tendon.id).toArray(),
      readMeta<SessionMeta>(db, "session"),
    ]);
    return { project, sets, detensions, records, session };
  }, [db, tendon.id, tendon.projectId]);

  if (!data?.project) return null;
  const { project, sets } = data;
  const timeZone = projectTimeZone(project);
  const mine = data.detensions.filter((d) => d.dispositionId === dispositionId);
  const waiting = awaitingRestressOf(tendon, data.detensions, data.records);

  return (
    <FollowUpPanel
      names={DETENSION}
      dispositionId={dispositionId}
      session={data.session}
      recorded={mine.length}
      form={(order) => <DetensionForm tendon={tendon} {...order} project={project} sets={sets} />}
    >
      {mine.length > 0 && (
        <ul className="grid gap-2" data-testid="detension-list">
          {mine.map((d) => (
            <DetensionItem key={d.id} detension={d} project={project} timeZone={timeZone} sets={sets} />
          ))}
        </ul>
      )}
      {waiting.length > 0 && (
        <p className="font-bold text-signal-stop" data-testid="detension-restress-required">
          Detensioned: restress required at end {waiting.join(" and ")}. The tendon stays held until the restress is
          logged.
        </p>
      )}
    </FollowUpPanel>
  );
}

function DetensionItem(props: {
  detension: LocalDetension;
  project: FieldProject;
  timeZone: string;
  sets: { id: string; name: string }[];
}) {
  const { detension: d, project } = props;
  const set = props.sets.find((s) => s.id === d.equipmentSetId);
  return (
    <li className="grid gap-1 rounded-md border-2 border-concrete-500 bg-white p-3" data-testid="detension-item">
      <p className="font-semibold">
        Detensioned {formatDateTime(d.detensionedAt, props.timeZone)} · {d.strandsDetensioned} strand
        {d.strandsDetensioned === 1 ? "" : "s"} · jack run by {d.operatorName} · set {set?.name ?? "not on this tablet"}
      </p>
      <p>
        Gauge at release: {d.entered ? pressureAsTyped(project, d.entered, d.releasePressureMPa) : "not read"}
        {d.remarks ? ` · ${d.remarks}` : ""}
      </p>
      <p className="text-ink-soft" data-testid="detension-state">
        Recorded by {d.recordedByName} ·{" "}
        {d.syncState === "synced"
          ? "received by the server"
          : d.syncState === "pending"
            ? "saved on this tablet, waiting to send"
            : `needs attention (${d.syncState}): see “Needs attention” on the field log`}
      </p>
    </li>
  );
}

function DetensionForm(
  props: FollowUpOrder<SessionMeta> & {
    tendon: FieldTendon;
    project: FieldProject;
    sets: { id: string; name: string; gaugeSerial: string }[];
  },
) {
  const { db } = useField();
  const { tendon, project, sets, session } = props;
  const unit = entryUnitsFor(project.unitSystem).pressure;
  const timeZone = projectTimeZone(project);
  // The box shows minutes; left as it was offered, the detension is stamped with the moment of saving.
  const [offered] = useState(() => localInputValue(new Date(), timeZone));
  const [values, setValues] = useState<Record<Box, string>>(() => ({
    when: offered,
    operator: session.name,
    pressure: "",
    strands: String(tendon.strandCount),
    remarks: "",
  }));
  const { when, operator, pressure, strands, remarks } = values;
  const [setId, setSetId] = useState(sets.length === 1 ? sets[0]!.id : "");
  const [errors, setErrors] = useState<Partial<Record<Field | "root", string>>>({});
  const [busy, setBusy] = useState(false);
  const formId = useId();
  /** What ties a box to its value, its problem and its test id. */
  const box = (name: Box) => ({
    id: `${formId}-${name}`,
    value: values[name],
    onChange: (e: React.ChangeEvent<HTMLInputElement | HTMLTextAreaElement>) => {
      const value = e.target.value;
      setValues((v) => ({ ...v, [name]: value }));
    },
    "data-testid": `detension-${name}`,
    error: errors[BOX_FIELD[name]],
    announce: true,
  });

  const submit = async (event: React.FormEvent) => {
    event.preventDefault();
    const found: Partial<Record<Field | "root", string>> = {};
    const at = when === offered ? new Date() : instantFromLocalInput(when, timeZone);
    if (!at) found.detensionedAt = "Give the date and time of the detension.";
    else if (at.getTime() > Date.now() + FUTURE_SLACK_MS)
      found.detensionedAt = "The detension cannot be in the future: give the time it was done.";
    let pressureMPa: number | null = null;
    if (pressure.trim()) {
      try {
        pressureMPa = parsePressure(pressure, { field: "pressure", system: "SI", defaultUnit: unit });
        if (!(pressureMPa > 0)) found.pressure = "The gauge pressure at release must be above zero.";
      } catch (e) {
        if (!isInputError(e)) throw e;
        found.pressure = `“${pressure}” cannot be read as a pressure. Type a number, e.g. ${unit === "psi" ? "4200" : "29.0"}, or leave it empty if it was not read.`;
      }
    }
    if (!setId) found.equipmentSetId = "Choose the equipment set used.";
    const count = Number(strands.trim());
    if (!/^\d+$/.test(strands.trim()) || count < 1)
      found.strandsDetensioned = "Type how many strands were detensioned (a whole number, at least 1).";
    else if (count > tendon.strandCount)
      found.strandsDetensioned = `${tendon.tag} has ${tendon.strandCount} strand${tendon.strandCount === 1 ? "" : "s"}.`;
    const payload: DetensionPayload = {
      projectId: tendon.projectId,
      pourId: tendon.pourId,
      tendonId: tendon.id,
      dispositionId: props.dispositionId,
      detensionedAt: (at ?? new Date()).toISOString(),
      operatorName: operator.trim(),
      equipmentSetId: setId,
      ...(pressure.trim() ? { pressure: pressure.trim() } : {}),
      pressureUnit: unit,
      strandsDetensioned: count,
      ...(remarks.trim() ? { remarks: remarks.trim() } : {}),
      authorUserId: session.userId,
    };
    const parsed = detensionPayloadSchema.safeParse(payload);
    if (!parsed.success)
      for (const [field, messages] of Object.entries(zodFields(parsed.error))) {
        const key = (FIELDS.includes(field) ? field : "root") as Field | "root";
        found[key] ??= messages.join(" ");
      }
    setErrors(found);
    if (Object.keys(found).length) return;
    setBusy(true);
    try {
      await saveDetension(db, { payload, releasePressureMPa: pressureMPa, authorName: session.name });
      props.onDone(true);
    } catch (e) {
      setErrors({ root: saveFailure(e, "the detension") });
    } finally {
      setBusy(false);
    }
  };

  return (
    <ClientForm className="grid gap-4" onSubmit={(e) => void submit(e)} noValidate data-testid="detension-form">
      <FormProblem message={errors.root} />
      <FormField {...box("when")} label={`When (${timeZone})`} type="datetime-local" />
      <FormField {...box("operator")} label="Jack operator" autoComplete="off" />
      <SetChoice
        name="detension-set"
        sets={sets}
        value={setId}
        onChange={setSetId}
        errorId={`${formId}-set-error`}
        error={errors.equipmentSetId}
      />
      <div className="grid gap-4 landscape:grid-cols-2">
        <FormField {...box("pressure")} label={`Gauge pressure at release (${unit}, if read)`} numeric />
        <FormField {...box("strands")} label={`Strands detensioned (of ${tendon.strandCount})`} numeric="integer" />
      </div>
      <FormField as="textarea" {...box("remarks")} label="Remarks" rows={2} />
      <p>
        Recorded by <strong>{session.name}</strong>. After the detension the tendon stays held until its restress is
        logged.
      </p>
      <FollowUpActions
        busy={busy}
        saveLabel="Save detension"
        saveTestId="detension-save"
        onCancel={() => props.onDone(false)}
      />
    </ClientForm>
  );
}
