import { redirect } from "next/navigation";
import { ProjectsForRole } from "@/components/shell/projects-for-role";
import { getSessionUser } from "@/lib/auth/session";

export const metadata = { title: "Decisions" };

export default async function DecisionsPage() {
  const user = await getSessionUser();
  if (!user) redirect("/sign-in");
  return (
    <main>
      <h1 className="text-figure font-bold">Decisions</h1>
      <p className="mt-2 text-ink-soft">The projects on which you are the engineer of record.</p>
      <ProjectsForRole user={user} roles={["engineer"]} links={() => []} empty="You are engineer of record on no project." />
    </main>
  );
}
