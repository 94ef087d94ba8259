import { redirect } from "next/navigation";
import { ProjectsForRole } from "@/components/shell/projects-for-role";
import { getSessionUser } from "@/lib/auth/session";

export const metadata = { title: "Flags to review" };

export default async function ReviewPage() {
  const user = await getSessionUser();
  if (!user) redirect("/sign-in");
  return (
    <main>
      <h1 className="text-figure font-bold">Flags to review</h1>
      <p className="mt-2 text-ink-soft">The projects whose flagged records you review.</p>
      <ProjectsForRole user={user} roles={["inspector", "engineer"]} links={() => []} empty="You review no project." />
    </main>
  );
}
