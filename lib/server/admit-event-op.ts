import "server-only";
import type { Insertable, Kysely } from "kysely";
import type { z } from "zod";
import type { Database } from "@/db/types";
import { can } from "@/lib/auth/permissions";
import type { OpResult, SyncOp } from "@/lib/schemas/sync";
import { zodFields } from "@/lib/schemas/zod-fields";
import { isInputError, parsePressure, type PressureUnit } from "@/lib/units";
import { claimOrRepeat, rejectedOp } from "./applied-ops";
import { auditInsert, recordAudit } from "./record-audit";

/**
 * What the crew's event ops (a tails cut, a lift-off check, a detension) check before anything is
 * read: the payload against its schema, no base version (an event is never a correction), the
 * sender a member of the payload's project whose role may record (else NOT_FOUND or FORBIDDEN,
 * audited as a denial), and the payload's author the signed-in person (a tablet shared by a crew
 * sends each person's ops under their own sign-in). Nothing is written when it refuses.
 */

export interface OpSender {
  id: string;
  memberships: { projectId: string; role: Parameters<typeof can>[0] }[];
}

export interface EventOpKind<S extends z.ZodType<{ projectId: string; authorUserId: string }>> {
  schema: S;
  /** The op in words, after an article: "detension", "lift-off check", "tails cut". */
  noun: string;
  /** What the role must allow, in words: "a detension", "tails cut". */
  recording: string;
  /** The audit action of a denial. */
  auditAction: string;
}

export type Admission<T> = { ok: true; payload: T } | { ok: false; result: OpResult };

export async function admitEventOp<S extends z.ZodType<{ projectId: string; authorUserId: string }>>(
  db: Kysely<Database>,
  user: OpSender,
  op: SyncOp,
  kind: EventOpKind<S>,
): Promise<Admission<z.infer<S>>> {
  const refuse = (result: OpResult) => ({ ok: false as const, result });
  const parsed = kind.schema.safeParse(op.payload);
  if (!parsed.success) {
    const fields = zodFields(parsed.error);
    return refuse(
      rejectedOp(op, "INVALID_INPUT", `Check the ${kind.noun}: ${Object.keys(fields).join(", ")}.`, fields),
    );
  }
  const payload = parsed.data;
  if (op.baseVersion !== undefined)
    return refuse(
      rejectedOp(op, "INVALID_INPUT", `A ${kind.noun} is never a correction: send it without a base version.`, {
        baseVersion: [`Not allowed on a ${kind.noun}.`],
      }),
    );
  const membership = user.memberships.find((m) => m.projectId === payload.projectId);
  if (!membership || !can(membership.role, "record.create")) {
    const result = membership
      ? rejectedOp(
          op,
          "FORBIDDEN",
          `Your role on this project (${membership.role}) does not allow recording ${kind.recording}.`,
        )
      : rejectedOp(op, "NOT_FOUND", "No such project among yours.");
    await recordAudit(db, {
      action: kind.auditAction,
      outcome: "denied",
      actorUserId: user.id,
      target: op.recordId,
      detail: { opId: op.opId, reason: result.error!.message },
    });
    return refuse(result);
  }
  if (payload.authorUserId !== user.id)
    return refuse(
      rejectedOp(
        op,
        "FORBIDDEN",
        `This ${kind.noun} was recorded by another person on this tablet; it is sent when they sign in.`,
        { authorUserId: ["Not the signed-in person."] },
      ),
    );
  return { ok: true, payload };
}

/** A refusal of one field, the message standing for the field too. */
export const refusedField = (op: SyncOp, field: string, message: string): OpResult =>
  rejectedOp(op, "INVALID_INPUT", message, { [field]: [message] });

/** The audit of an event op applied, on the payload's tendon, with the op id and device. */
export function auditEventOp(
  trx: Kysely<Database>,
  input: {
    action: string;
    user: OpSender;
    payload: { projectId: string; tendonId: string };
    deviceId: string;
    detail: Record<string, unknown>;
  },
): Promise<unknown> {
  return auditInsert(trx, {
    action: input.action,
    outcome: "success",
    actorUserId: input.user.id,
    projectId: input.payload.projectId,
    target: input.payload.tendonId,
    detail: { ...input.detail, deviceId: input.deviceId },
  }).execute();
}

/**
 * Claims the event op's id for its sender (`claimOrRepeat`), with the answer a repeat will get: null
 * when this delivery claimed it, else the answer to the concurrent delivery that committed first.
 */
export function claimEventOp(
  trx: Kysely<Database>,
  op: SyncOp,
  sender: { user: OpSender; deviceId: string; projectId: string },
  result: object,
): Promise<OpResult | null> {
  return claimOrRepeat(trx, {
    op,
    projectId: sender.projectId,
    deviceId: sender.deviceId,
    userId: sender.user.id,
    result,
  });
}

/** The insert of a flag an event raises on the payload's tendon (of no record, no evaluation), as of now. */
export function insertEventFlag(
  trx: Kysely<Database>,
  payload: { projectId: string; pourId: string; tendonId: string },
  flag: { kind: Insertable<Database["flags"]>["kind"]; reason: string },
) {
  return trx.insertInto("flags").values({
    project_id: payload.projectId,
    pour_id: payload.pourId,
    tendon_id: payload.tendonId,
    record_id: null,
    evaluation_id: null,
    kind: flag.kind,
    reason: flag.reason,
    created_at: new Date(),
  });
}

/**
 * A gauge pressure as the crew typed it on an event op, in MPa (a bare number is in the unit the
 * tablet sent beside it); null when it cannot be read as a pressure, for the caller to refuse.
 */
export function typedPressureMPa(text: string, unit: PressureUnit): number | null {
  try {
    return parsePressure(text, { field: "pressure", system: "SI", defaultUnit: unit });
  } catch (error) {
    if (!isInputError(error)) throw error;
    return null;
  }
}
