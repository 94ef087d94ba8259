import { redirect } from "next/navigation";
import { ProjectsForRole } from "@/components/shell/projects-for-role";
import { getSessionUser } from "@/lib/auth/session";

export const metadata = { title: "Field log" };

export default async function FieldPage() {
  const user = await getSessionUser();
  if (!user) redirect("/sign-in");
  return (
    <main>
      <h1 className="text-figure font-bold">Field log</h1>
      <p className="mt-2 text-ink-soft">The projects you stress tendons on.</p>
      <ProjectsForRole user={user} roles={["crew"]} links={() => []} empty="You are not on a stressing crew of any project." />
    </main>
  );
}
