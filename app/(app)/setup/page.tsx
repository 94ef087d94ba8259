import { redirect } from "next/navigation";
import { ProjectsForRole } from "@/components/shell/projects-for-role";
import { getSessionUser } from "@/lib/auth/session";

export const metadata = { title: "Project setup" };

export default async function SetupPage() {
  const user = await getSessionUser();
  if (!user) redirect("/sign-in");
  return (
    <main>
      <h1 className="text-figure font-bold">Project setup</h1>
      <p className="mt-2 text-ink-soft">The projects you administer: the people on each and their roles.</p>
      <ProjectsForRole
        user={user}
        roles={["admin"]}
        links={(id) => [{ href: `/projects/${id}/members`, label: "People and invitations" }]}
        empty="You are not an admin on any project."
      />
    </main>
  );
}
