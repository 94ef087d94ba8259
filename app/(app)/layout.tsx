import { redirect } from "next/navigation";
import type { ReactNode } from "react";
import { AppNav } from "@/components/shell/app-nav";
import { MailFlowBanner } from "@/components/shell/mail-flow-banner";
import { getSessionUser } from "@/lib/auth/session";
import { navFor } from "@/lib/navigation";

// Signed-in office screens. The redirect is for convenience only: every page and route
// handler still checks access itself through lib/auth/authorize.ts.
export default async function SignedInLayout({ children }: { children: ReactNode }) {
  const user = await getSessionUser();
  if (!user) redirect("/sign-in");
  const roles = [...new Set(user.memberships.map((m) => m.role))];
  return (
    <div className="min-h-screen">
      <AppNav items={navFor(roles)} userName={user.name} />
      <MailFlowBanner user={user} />
      <div className="mx-auto max-w-7xl px-4 py-8">{children}</div>
    </div>
  );
}
