import Link from "next/link";
import { redirect } from "next/navigation";
import { SignInForm } from "@/components/auth/sign-in-form";
import { getSessionUser } from "@/lib/auth/session";

export const metadata = { title: "Sign in" };

const LINK_ERRORS: Record<string, string> = {
  Verification: "That sign-in link has expired or was already used. Ask for a new one.",
  AccessDenied: "That sign-in link cannot be used. Ask for a new one or sign in with your password.",
};

function safeCallback(value: string | string[] | undefined): string {
  const v = Array.isArray(value) ? value[0] : value;
  return v && v.startsWith("/") && !v.startsWith("//") ? v : "/home";
}

export default async function SignInPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const params = await searchParams;
  const callbackUrl = safeCallback(params.callbackUrl);
  if (await getSessionUser()) redirect(callbackUrl);
  const errorKey = Array.isArray(params.error) ? params.error[0] : params.error;
  const initialError = errorKey ? (LINK_ERRORS[errorKey] ?? "Sign-in did not work. Try again.") : undefined;
  return (
    <>
      <h1 className="text-figure font-bold">Sign in</h1>
      <p className="mt-2 text-ink-soft">With your password, or with a one-time link sent to your e-mail.</p>
      <div className="mt-6">
        <SignInForm callbackUrl={callbackUrl} initialError={initialError} />
      </div>
      <p className="mt-6">
        <Link href="/reset-password">Forgot your password?</Link>
      </p>
    </>
  );
}
