import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { db } from "@/db";
import { existsInProject } from "@/lib/server/exists-in-project";
import { isUuid } from "../../page-access";

// A pour of this project, or 404. The project's own check ran in the layout above; this one is here, above every
// loading state of the segment, so a missing one answers a real 404.
export default async function Layout({
  children,
  params,
}: {
  children: ReactNode;
  params: Promise<{ projectId: string; pourId: string }>;
}) {
  const { projectId, pourId } = await params;
  if (!isUuid(pourId) || !(await existsInProject(db, { projectId, table: "pours", id: pourId }))) notFound();
  return children;
}
