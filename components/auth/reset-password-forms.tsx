"use client";

import { useRouter } from "next/navigation";
import { FormMessage } from "@/components/ui/form-message";
import { FormField } from "@/components/ui/form-field";
import { sendJson } from "@/lib/client/send-json";
import { useApiCall } from "@/lib/client/use-api-call";
import { ClientForm } from "@/components/ui/client-form";

export function RequestResetForm() {
  const { message, fields, call } = useApiCall(["email"]);
  return (
    <ClientForm
      className="space-y-5"
      onSubmit={async (e) => {
        e.preventDefault();
        const email = String(new FormData(e.currentTarget).get("email") ?? "");
        await call(sendJson<{ message: string }>("POST", "/api/password-reset", { email }), (data) => data.message);
      }}
    >
      <FormMessage tone={message?.tone ?? "info"}>{message?.text}</FormMessage>
      <FormField id="email" name="email" type="email" autoComplete="username" label="E-mail" error={fields.email} />
      <button type="submit" className="btn-primary">
        Send a reset link
      </button>
    </ClientForm>
  );
}

export function NewPasswordForm({ token }: { token: string }) {
  const router = useRouter();
  const { message, fields, call } = useApiCall(["password"]);
  return (
    <ClientForm
      className="space-y-5"
      onSubmit={async (e) => {
        e.preventDefault();
        const password = String(new FormData(e.currentTarget).get("password") ?? "");
        const result = await call(sendJson("POST", "/api/password-reset/complete", { token, password }));
        if (result.ok) router.push("/sign-in?reset=done");
      }}
    >
      <FormMessage tone="error">{message?.text}</FormMessage>
      <FormField
        id="password"
        name="password"
        type="password"
        autoComplete="new-password"
        label="New password (10 characters or more)"
        error={fields.password}
      />
      <button type="submit" className="btn-primary">
        Save the new password
      </button>
    </ClientForm>
  );
}
