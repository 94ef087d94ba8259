import Link from "next/link";
import { AcceptInvitationForm } from "@/components/auth/accept-invitation-form";
import { db } from "@/db";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import { isAppError } from "@/lib/errors";
import { tokenSchema } from "@/lib/schemas/account";
import { previewInvitation } from "@/lib/server/accept-invitation";

export const metadata = { title: "Invitation" };

export default async function InvitationPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const preview = tokenSchema.safeParse(token).success
    ? await previewInvitation(db, token).catch((e: unknown) => (isAppError(e) ? e : Promise.reject(e)))
    : null;

  if (!preview || isAppError(preview)) {
    return (
      <>
        <h1 className="text-figure font-bold">This invitation cannot be used</h1>
        <p className="mt-3">{preview?.message ?? "The link is not complete. Open it from the e-mail again."}</p>
        <p className="mt-6">
          <Link href="/sign-in">Go to sign in</Link>
        </p>
      </>
    );
  }
  return (
    <>
      <h1 className="text-figure font-bold">Join {preview.projectName}</h1>
      <p className="mt-3">
        You are invited as <strong>{ROLE_LABELS[preview.role]}</strong> with the address{" "}
        <strong>{preview.email}</strong>.
      </p>
      <div className="mt-6">
        <AcceptInvitationForm token={token} email={preview.email} hasAccount={preview.hasAccount} />
      </div>
    </>
  );
}
