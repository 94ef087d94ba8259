import "server-only";
import type { Kysely, QueryCreator, Transaction } from "kysely";
import type { Database } from "@/db/types";
import type { AuditOutcome } from "@/lib/schemas/domain";

export interface AuditEvent {
  action: string;
  outcome: AuditOutcome;
  actorUserId?: string | null;
  actorEmail?: string | null;
  projectId?: string | null;
  target?: string | null;
  ip?: string | null;
  detail?: Record<string, unknown>;
}

/** Appends one security event. Never pass secrets, tokens or session ids in `detail`. */
export async function recordAudit(db: Kysely<Database> | Transaction<Database>, event: AuditEvent): Promise<void> {
  await auditInsert(db, event).execute();
}

/** The insert of one security event, for a caller that sends it with other writes in one statement. */
export function auditInsert(qc: QueryCreator<Database>, event: AuditEvent) {
  return qc.insertInto("audit_events").values({
    action: event.action,
    outcome: event.outcome,
    actor_user_id: event.actorUserId ?? null,
    actor_email: event.actorEmail ?? null,
    project_id: event.projectId ?? null,
    target: event.target ?? null,
    ip: event.ip ?? null,
    detail: JSON.stringify(event.detail ?? {}),
  });
}
