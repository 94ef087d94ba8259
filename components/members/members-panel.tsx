"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { ConfirmDialog } from "@/components/ui/confirm-dialog";
import { FieldError, FormMessage } from "@/components/ui/form-message";
import { FormField } from "@/components/ui/form-field";
import type { Role } from "@/lib/schemas/domain";
import { ROLE_LABELS, ROLES } from "@/lib/auth/permissions";
import { sendJson } from "@/lib/client/send-json";
import { useApiCall } from "@/lib/client/use-api-call";
import { formatDay } from "@/lib/format/dates";
import { ClientForm } from "@/components/ui/client-form";

/** Roles whose rights cannot be handed out or taken back in passing: deciding on flags, running the project. */
const WEIGHTY: ReadonlySet<Role> = new Set(["engineer", "admin"]);

/** What a role change gives and takes, in words, for the confirmation. */
export function roleChangeConsequence(name: string, from: Role, to: Role): string[] {
  const lines = [`${name} changes from ${ROLE_LABELS[from]} to ${ROLE_LABELS[to]}, from their next page on.`];
  if (to === "engineer")
    lines.push(`${name} will be able to record dispositions on flags and release pours, signed with their licence.`);
  if (to === "admin")
    lines.push(
      `${name} will be able to change the project's settings, schedule and equipment, and add or remove people.`,
    );
  if (from === "engineer") lines.push(`${name} will no longer be able to record dispositions or release pours.`);
  if (from === "admin") lines.push(`${name} will no longer be able to change settings or manage people.`);
  return lines;
}

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

type Pending = { kind: "role"; member: Member; to: Role } | { kind: "remove"; member: Member };

export function MembersPanel(props: {
  projectId: string;
  currentUserId: string;
  members: Member[];
  invitations: Invitation[];
  timeZone: string;
}) {
  const router = useRouter();
  // The invitation's refusals beside its boxes; a change of role or a removal answers in the table.
  const invite = useApiCall(["email", "role"]);
  const { message, call } = useApiCall(["role"]);
  const fields = invite.fields;
  const base = `/api/projects/${props.projectId}`;
  const [pending, setPending] = useState<Pending | null>(null);
  // What each select shows while a change waits for its confirmation or for the server.
  const [shownRole, setShownRole] = useState<Record<string, Role>>({});
  const [rowError, setRowError] = useState<Record<string, string[]>>({});

  async function changeRole(member: Member, to: Role) {
    setShownRole((s) => ({ ...s, [member.userId]: to }));
    const result = await call(
      sendJson("PATCH", `${base}/members/${member.userId}`, { role: to }),
      `${member.name} is now ${ROLE_LABELS[to]}.`,
    );
    if (result.ok) {
      setRowError((e) => ({ ...e, [member.userId]: [] }));
      router.refresh();
    } else {
      setShownRole((s) => ({ ...s, [member.userId]: member.role }));
      setRowError((e) => ({ ...e, [member.userId]: result.error.fields?.role ?? [result.error.message] }));
    }
  }

  function confirmPending() {
    const p = pending;
    setPending(null);
    if (!p) return;
    if (p.kind === "role") void changeRole(p.member, p.to);
    else void run(sendJson("DELETE", `${base}/members/${p.member.userId}`), `${p.member.name} was removed.`);
  }

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
        <ClientForm
          className="mt-4 grid gap-4 md:grid-cols-[2fr_1fr_auto] md:items-end"
          // The server's words beside the box, not the browser's bubble, answer a bad address.
          noValidate
          onSubmit={async (e) => {
            e.preventDefault();
            const form = e.currentTarget;
            const data = new FormData(form);
            const email = String(data.get("email") ?? "");
            const result = await invite.call(
              sendJson("POST", `${base}/invitations`, { email, role: data.get("role") }),
              `Invitation sent to ${email}.`,
            );
            if (result.ok) {
              form.reset();
              router.refresh();
            }
          }}
        >
          {invite.message && (
            <div className="md:col-span-3">
              <FormMessage tone={invite.message.tone}>{invite.message.text}</FormMessage>
            </div>
          )}
          <FormField id="invite-email" name="email" type="email" label="E-mail" error={fields.email} />
          <FormField as="select" id="invite-role" name="role" label="Role" defaultValue="crew" error={fields.role}>
            {ROLES.map((r) => (
              <option key={r} value={r}>
                {ROLE_LABELS[r]}
              </option>
            ))}
          </FormField>
          <button type="submit" className="btn-primary">
            Send invitation
          </button>
        </ClientForm>
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
                    value={shownRole[m.userId] ?? m.role}
                    aria-invalid={rowError[m.userId]?.length ? true : undefined}
                    aria-describedby={rowError[m.userId]?.length ? `role-${m.userId}-error` : undefined}
                    onChange={(e) => {
                      const to = e.target.value as Role;
                      if (to === m.role) return;
                      if (WEIGHTY.has(to) || WEIGHTY.has(m.role)) setPending({ kind: "role", member: m, to });
                      else void changeRole(m, to);
                    }}
                  >
                    {ROLES.map((r) => (
                      <option key={r} value={r}>
                        {ROLE_LABELS[r]}
                      </option>
                    ))}
                  </select>
                  <FieldError id={`role-${m.userId}-error`} messages={rowError[m.userId]} />
                </td>
                <td className="p-3 text-right">
                  {m.userId !== props.currentUserId && (
                    <button
                      type="button"
                      className="btn-quiet"
                      onClick={() => setPending({ kind: "remove", member: m })}
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
                  {i.expired ? "expired" : `expires ${formatDay(i.expiresAt, props.timeZone)}`} · sent {i.sentCount}×
                </span>
                <button
                  type="button"
                  className="btn-quiet"
                  onClick={() =>
                    void run(sendJson("POST", `${base}/invitations/${i.id}/resend`), `Sent again to ${i.email}.`)
                  }
                >
                  Send again
                </button>
                <button
                  type="button"
                  className="btn-quiet"
                  onClick={() =>
                    void run(sendJson("DELETE", `${base}/invitations/${i.id}`), `Invitation to ${i.email} withdrawn.`)
                  }
                >
                  Withdraw
                </button>
              </li>
            ))}
          </ul>
        )}
      </section>

      <ConfirmDialog
        open={pending !== null}
        title={
          pending?.kind === "remove"
            ? `Remove ${pending.member.name} from the project?`
            : pending
              ? `Make ${pending.member.name} ${ROLE_LABELS[pending.to]}?`
              : ""
        }
        confirmLabel={
          pending?.kind === "remove"
            ? `Remove ${pending.member.name}`
            : pending
              ? `Make ${pending.member.name} ${ROLE_LABELS[pending.to]}`
              : "Confirm"
        }
        onConfirm={confirmPending}
        onCancel={() => setPending(null)}
      >
        {pending?.kind === "remove" ? (
          <>
            <p>
              {pending.member.name} loses access to this project at once, on every device: no pages, no records, no
              e-mails about its flags.
            </p>
            <p>
              Their past records, findings and decisions stay on the project under their name. To bring them back,
              invite them again.
            </p>
          </>
        ) : pending ? (
          roleChangeConsequence(pending.member.name, pending.member.role, pending.to).map((line) => (
            <p key={line}>{line}</p>
          ))
        ) : null}
      </ConfirmDialog>
    </div>
  );
}
