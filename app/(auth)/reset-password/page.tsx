import Link from "next/link";
import { RequestResetForm } from "@/components/auth/reset-password-forms";

export const metadata = { title: "Reset password" };

export default function ResetPasswordPage() {
  return (
    <>
      <h1 className="text-figure font-bold">Reset your password</h1>
      <p className="mt-2 text-ink-soft">
        Enter the address you sign in with; a link to choose a new password follows by e-mail.
      </p>
      <div className="mt-6">
        <RequestResetForm />
      </div>
      <p className="mt-6">
        <Link href="/sign-in">Back to sign in</Link>
      </p>
    </>
  );
}
