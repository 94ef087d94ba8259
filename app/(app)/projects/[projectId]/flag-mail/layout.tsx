import type { ReactNode } from "react";
import { pageAccess } from "../page-access";

// Only an engineer chooses how flags reach them.
// Checked here, above this segment's loading state, so a refusal answers 404 before the page streams.
export default async function Layout({
  children,
  params,
}: {
  children: ReactNode;
  params: Promise<{ projectId: string }>;
}) {
  await pageAccess("flag_mail.choose", (await params).projectId);
  return children;
}
