import Link from "next/link";
import { db } from "@/db";
import type { SessionUser } from "@/lib/auth/session";
import { formatAge } from "@/lib/format/dates";
import { checkMailFlow } from "@/lib/server/check-mail-flow";

/**
 * Warns the engineer and the project admin when flag e-mail is not going out: the dispatcher
 * has gone quiet, an e-mail has waited too long, or an e-mail was given up on after every retry
 * (each listed with its tendon, so the flag is not missed). Shows nothing while e-mail flows.
 */
export async function MailFlowBanner({ user }: { user: SessionUser }) {
  const projectIds = user.memberships
    .filter((m) => m.role === "engineer" || m.role === "admin")
    .map((m) => m.projectId);
  if (projectIds.length === 0) return null;
  const flow = await checkMailFlow(db, projectIds).catch(() => null);
  if (!flow || (flow.state === "flowing" && flow.failed.length === 0)) return null;
  return (
    <section
      role="alert"
      aria-label="E-mail is not going out"
      className="border-b-2 border-signal-stop bg-signal-stop-bg px-4 py-3"
    >
      <div className="mx-auto max-w-6xl space-y-1">
        {flow.state === "stalled" && (
          <p>
            <strong>E-mail stopped: flag e-mails are not going out.</strong>{" "}
            {flow.lastHeartbeatAt
              ? `The mail sender last ran ${formatAge(flow.lastHeartbeatAt)}`
              : "The mail sender has not run yet"}
            {flow.pending > 0 && flow.oldestPendingAt
              ? `; ${flow.pending} e-mail${flow.pending > 1 ? "s" : ""} waiting, the oldest queued ${formatAge(flow.oldestPendingAt)}.`
              : "."}{" "}
            Check open flags here rather than waiting for e-mail, and tell whoever runs the server.
          </p>
        )}
        {flow.failed.length > 0 && (
          <>
            <p>
              <strong>
                {flow.failed.length} flag e-mail{flow.failed.length > 1 ? "s" : ""} could not be sent after every retry:
              </strong>
            </p>
            <ul className="list-disc pl-6">
              {flow.failed.map((f) => (
                <li key={f.notificationId}>
                  {f.tendonId ? (
                    <Link href={`/projects/${f.projectId}/tendons/${f.tendonId}/flags`}>Tendon {f.tendonTag}</Link>
                  ) : (
                    f.subject
                  )}
                  {f.lastError ? ` (${f.lastError})` : ""}
                </li>
              ))}
            </ul>
          </>
        )}
      </div>
    </section>
  );
}
