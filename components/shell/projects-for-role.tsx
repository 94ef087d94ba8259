import Link from "next/link";
import type { Role } from "@/db/types";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/session";

/** The projects on which the person holds one of the given roles, each with its links. */
export function ProjectsForRole({
  user,
  roles,
  links,
  empty,
}: {
  user: SessionUser;
  roles: Role[];
  links: (projectId: string) => { href: string; label: string }[];
  empty: string;
}) {
  const projects = user.memberships.filter((m) => roles.includes(m.role));
  if (!projects.length) return <p className="card mt-6">{empty}</p>;
  return (
    <ul className="mt-6 grid gap-4 md:grid-cols-2">
      {projects.map((p) => (
        <li key={p.projectId} className="card">
          <h2 className="text-lead font-semibold">{p.projectName}</h2>
          <p className="text-label uppercase text-ink-faint">
            {p.projectCode} · {ROLE_LABELS[p.role]}
          </p>
          <ul className="mt-3 flex flex-wrap gap-2">
            {links(p.projectId).map((l) => (
              <li key={l.href}>
                <Link href={l.href} className="btn-quiet">
                  {l.label}
                </Link>
              </li>
            ))}
          </ul>
        </li>
      ))}
    </ul>
  );
}
