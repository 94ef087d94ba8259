"use client";

import type { SignInOptions, SignInResponse } from "next-auth/react";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { FormField } from "@/components/ui/form-field";
import { FormMessage } from "@/components/ui/form-message";
import { ClientForm } from "@/components/ui/client-form";

// next-auth's client code loads only when a button is pressed, not with the page: the page's
// first load stays the framework's, and the form is usable as soon as it is drawn.
async function signIn(provider: "credentials" | "email", options: SignInOptions): Promise<SignInResponse | undefined> {
  const { signIn: send } = await import("next-auth/react");
  return send<typeof provider>(provider, options);
}

// The same words for every failure, so the form never tells whether an account exists.
const FAILED =
  "That e-mail and password did not open an account. Check both and try again; after several failed tries, sign-in pauses for 15 minutes.";

export function SignInForm({ callbackUrl, initialError }: { callbackUrl: string; initialError?: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | undefined>(initialError);
  const [busy, setBusy] = useState<"password" | "link" | null>(null);
  const [emailError, setEmailError] = useState<string>();

  async function withPassword(form: FormData) {
    setBusy("password");
    setError(undefined);
    setEmailError(undefined);
    const result = await signIn("credentials", {
      email: String(form.get("email") ?? ""),
      password: String(form.get("password") ?? ""),
      redirect: false,
      callbackUrl,
    });
    setBusy(null);
    if (!result || result.error) return setError(FAILED);
    router.push(callbackUrl);
    router.refresh();
  }

  async function withLink(form: FormData) {
    const email = String(form.get("email") ?? "").trim();
    setError(undefined);
    if (!email) return setEmailError("Enter your e-mail address first, then ask for a link.");
    setEmailError(undefined);
    setBusy("link");
    await signIn("email", { email, callbackUrl, redirect: false });
    router.push("/sign-in/check-email");
  }

  return (
    // ClientForm keeps the boxes and buttons disabled until the page's script runs, so a press (or
    // Enter) cannot send the form the browser's own way, which would put the password in the address.
    <ClientForm
      className="space-y-5"
      method="post"
      onSubmit={(e) => {
        e.preventDefault();
        void withPassword(new FormData(e.currentTarget));
      }}
    >
      <FormMessage tone="error">{error}</FormMessage>
      <FormField
        id="email"
        name="email"
        type="email"
        label="E-mail"
        autoComplete="username"
        required
        error={emailError}
      />
      <FormField id="password" name="password" type="password" label="Password" autoComplete="current-password" />
      <div className="flex flex-wrap gap-3">
        <button type="submit" className="btn-primary" disabled={busy !== null}>
          {busy === "password" ? "Signing in…" : "Sign in"}
        </button>
        <button
          type="button"
          className="btn-quiet"
          disabled={busy !== null}
          onClick={(e) => void withLink(new FormData(e.currentTarget.form ?? undefined))}
        >
          {busy === "link" ? "Sending…" : "E-mail me a sign-in link"}
        </button>
      </div>
    </ClientForm>
  );
}
