import { headers } from "next/headers";
import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { db } from "@/db";
import { shareTokenSchema } from "@/lib/schemas/share-link";
import { shareLinkIssued } from "@/lib/server/get-share-board";

// A token that is not one of ours answers 404 (the not-found state of share/). Checked here, above
// this segment's loading state, so the answer is a real 404, not a streamed 200; the page audits the view.
export default async function Layout({
  children,
  params,
}: {
  children: ReactNode;
  params: Promise<{ token: string }>;
}) {
  const { token } = await params;
  const ip = (await headers()).get("x-forwarded-for")?.split(",")[0]?.trim() ?? null;
  if (!shareTokenSchema.safeParse(token).success || !(await shareLinkIssued(db, { token, ip }))) notFound();
  return children;
}
