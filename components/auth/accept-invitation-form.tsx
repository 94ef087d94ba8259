"use client";

import { signIn } from "next-auth/react";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { FormMessage } from "@/components/ui/form-message";
import { placeFields, refusedWords } from "@/lib/client/field-errors";
import { FormField } from "@/components/ui/form-field";
import { sendJson } from "@/lib/client/send-json";
import { ClientForm } from "@/components/ui/client-form";

export function AcceptInvitationForm({
  token,
  email,
  hasAccount,
}: {
  token: string;
  email: string;
  hasAccount: boolean;
}) {
  const router = useRouter();
  const [error, setError] = useState<string>();
  const [fields, setFields] = useState<Record<string, string[]>>({});
  const [busy, setBusy] = useState(false);

  async function accept(form: FormData) {
    setBusy(true);
    setError(undefined);
    setFields({});
    const password = String(form.get("password") ?? "");
    const body = hasAccount ? { token } : { token, name: String(form.get("name") ?? ""), password };
    const result = await sendJson("POST", "/api/invitations/accept", body);
    if (!result.ok) {
      setBusy(false);
      const placed = placeFields(result.error.fields, (k) => (k === "name" || k === "password" ? k : null));
      setError(refusedWords(result.error, placed));
      setFields(placed.boxes);
      return;
    }
    if (hasAccount) {
      router.push("/sign-in?callbackUrl=/home");
      return;
    }
    const signedIn = await signIn("credentials", { email, password, redirect: false });
    router.push(signedIn?.ok ? "/home" : "/sign-in");
    router.refresh();
  }

  return (
    <ClientForm
      className="space-y-5"
      onSubmit={(e) => {
        e.preventDefault();
        void accept(new FormData(e.currentTarget));
      }}
    >
      <FormMessage tone="error">{error}</FormMessage>
      {hasAccount ? (
        <p>You already have a Tautline account as {email}. Accept, then sign in as usual.</p>
      ) : (
        <>
          <FormField id="name" name="name" autoComplete="name" label="Your name" error={fields.name} />
          <FormField
            id="password"
            name="password"
            type="password"
            autoComplete="new-password"
            label="Choose a password (10 characters or more)"
            error={fields.password}
          />
        </>
      )}
      <button type="submit" className="btn-primary" disabled={busy}>
        {busy ? "Joining…" : "Accept and join"}
      </button>
    </ClientForm>
  );
}
