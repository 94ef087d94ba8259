import { redirect } from "next/navigation";
import { ProjectsForRole } from "@/components/shell/projects-for-role";
import { getSessionUser } from "@/lib/auth/session";
import { navFor } from "@/lib/navigation";

export const metadata = { title: "Today" };

export default async function HomePage() {
  const user = await getSessionUser();
  if (!user) redirect("/sign-in");
  const areas = navFor([...new Set(user.memberships.map((m) => m.role))]).filter((a) => a.href !== "/home");
  return (
    <main>
      <h1 className="text-figure font-bold">Today</h1>
      <p className="mt-2 text-ink-soft">Signed in as {user.name} ({user.email}).</p>
      {areas.length > 0 && (
        <ul className="mt-6 grid gap-4 md:grid-cols-2">
          {areas.map((area) => (
            <li key={area.href} className="card">
              <h2 className="text-lead font-semibold">
                <a href={area.href}>{area.label}</a>
              </h2>
              <p className="mt-1 text-ink-soft">{area.description}</p>
            </li>
          ))}
        </ul>
      )}
      <h2 className="mt-10 text-lead font-bold">Your projects</h2>
      <ProjectsForRole
        user={user}
        roles={["crew", "inspector", "engineer", "admin"]}
        links={() => []}
        empty="You are not on any project yet. A project admin adds people by invitation."
      />
    </main>
  );
}
