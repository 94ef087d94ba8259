"use client";

import { useRouter } from "next/navigation";
import { FormMessage } from "@/components/ui/form-message";
import { TextField } from "@/components/ui/text-field";
import type { Role } from "@/db/types";
import { ROLE_LABELS, ROLES } from "@/lib/auth/permissions";
import { sendJson } from "@/lib/client/send-json";
import { useApiCall } from "@/lib/client/use-api-call";

interface Member {
  userId: string;
  name: string;
  email: string;
  role: Role;
}
interface Invitation {
  id: string;
  email: string;
  role: Role;
  expiresAt: string;
  sentCount: number;
  expired: boolean;
}

export function MembersPanel(props: { projectId: string; currentUserId: string; members: Member[]; invitations: Invitation[] }) {
  const router = useRouter();
  const { message, fields, call } = useApiCall();
  const base = `/api/projects/${props.projectId}`;

  async function run(request: ReturnType<typeof sendJson>, done: string) {
    const result = await call(request, done);
    if (result.ok) router.refresh();
    return result.ok;
  }

  return (
    <div className="mt-6 space-y-8">
      <FormMessage tone={message?.tone ?? "info"}>{message?.text}</FormMessage>

      <section aria-labelledby="invite-heading" className="card">
        <h2 id="invite-heading" className="text-lead font-semibold">
          Invite someone
        </h2>
        <form
          className="mt-4 grid gap-4 md:grid-cols-[2fr_1fr_auto] md:items-end"
          onSubmit={async (e) => {
            e.preventDefault();
            const form = e.currentTarget;
            const data = new FormData(form);
            const email = String(data.get("email") ?? "");
            const ok = await run(
              sendJson("POST", `${base}/invitations`, { email, role: data.get("role") }),
              `Invitation sent to ${email}.`,
            );
            if (ok) form.reset();
          }}
        >
          <TextField id="invite-email" name="email" type="email" label="E-mail" errors={fields.email} />
          <div>
            <label htmlFor="invite-role" className="field-label">
              Role
            </label>
            <select id="invite-role" name="role" className="field-input mt-1" defaultValue="crew">
              {ROLES.map((r) => (
                <option key={r} value={r}>
                  {ROLE_LABELS[r]}
                </option>
              ))}
            </select>
          </div>
          <button type="submit" className="btn-primary">
            Send invitation
          </button>
        </form>
      </section>

      <section aria-labelledby="members-heading">
        <h2 id="members-heading" className="text-lead font-semibold">
          On the project ({props.members.length})
        </h2>
        <table className="mt-3 w-full border-collapse bg-white">
          <thead>
            <tr className="border-b-2 border-ink text-left">
              <th className="p-3">Name</th>
              <th className="p-3">E-mail</th>
              <th className="p-3">Role</th>
              <th className="p-3">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {props.members.map((m) => (
              <tr key={m.userId} className="border-b border-concrete-300">
                <td className="p-3">{m.name}</td>
                <td className="p-3">{m.email}</td>
                <td className="p-3">
                  <label className="sr-only" htmlFor={`role-${m.userId}`}>
                    Role of {m.name}
                  </label>
                  <select
                    id={`role-${m.userId}`}
                    className="field-input"
                    defaultValue={m.role}
                    onChange={(e) =>
                      void run(
                        sendJson("PATCH", `${base}/members/${m.userId}`, { role: e.target.value }),
                        `${m.name} is now ${ROLE_LABELS[e.target.value as Role]}.`,
                      )
                    }
                  >
                    {ROLES.map((r) => (
                      <option key={r} value={r}>
                        {ROLE_LABELS[r]}
                      </option>
                    ))}
                  </select>
                </td>
                <td className="p-3 text-right">
                  {m.userId !== props.currentUserId && (
                    <button
                      type="button"
                      className="btn-quiet"
                      onClick={() => {
                        if (window.confirm(`Remove ${m.name} from the project? They lose access at once.`)) {
                          void run(sendJson("DELETE", `${base}/members/${m.userId}`), `${m.name} was removed.`);
                        }
                      }}
                    >
                      Remove {m.name}
                    </button>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>

      <section aria-labelledby="invitations-heading">
        <h2 id="invitations-heading" className="text-lead font-semibold">
          Open invitations ({props.invitations.length})
        </h2>
        {props.invitations.length === 0 ? (
          <p className="mt-3 text-ink-soft">No invitation is waiting for an answer.</p>
        ) : (
          <ul className="mt-3 space-y-2">
            {props.invitations.map((i) => (
              <li key={i.id} className="card flex flex-wrap items-center gap-3">
                <span className="flex-1">
                  <strong>{i.email}</strong> as {ROLE_LABELS[i.role]} ·{" "}
                  {i.expired ? "expired" : `expires ${new Date(i.expiresAt).toLocaleDateString()}`} · sent {i.sentCount}×
                </span>
                <button type="button" className="btn-quiet" onClick={() => void run(sendJson("POST", `${base}/invitations/${i.id}/resend`), `Sent again to ${i.email}.`)}>
                  Send again
                </button>
                <button type="button" className="btn-quiet" onClick={() => void run(sendJson("DELETE", `${base}/invitations/${i.id}`), `Invitation to ${i.email} withdrawn.`)}>
                  Withdraw
                </button>
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
