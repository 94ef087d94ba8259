"use client";

import { useRouter } from "next/navigation";
import { FieldError, FormMessage } from "@/components/ui/form-message";
import { sendJson } from "@/lib/client/send-json";
import { useApiCall } from "@/lib/client/use-api-call";

export function RequestResetForm() {
  const { message, fields, call } = useApiCall();
  return (
    <form
      className="space-y-5"
      onSubmit={async (e) => {
        e.preventDefault();
        const email = String(new FormData(e.currentTarget).get("email") ?? "");
        await call(sendJson<{ message: string }>("POST", "/api/password-reset", { email }), (data) => data.message);
      }}
    >
      <FormMessage tone={message?.tone ?? "info"}>{message?.text}</FormMessage>
      <div>
        <label htmlFor="email" className="field-label">
          E-mail
        </label>
        <input id="email" name="email" type="email" autoComplete="username" className="field-input mt-1" aria-describedby="email-error" />
        <FieldError id="email-error" messages={fields.email} />
      </div>
      <button type="submit" className="btn-primary">
        Send a reset link
      </button>
    </form>
  );
}

export function NewPasswordForm({ token }: { token: string }) {
  const router = useRouter();
  const { message, fields, call } = useApiCall();
  return (
    <form
      className="space-y-5"
      onSubmit={async (e) => {
        e.preventDefault();
        const password = String(new FormData(e.currentTarget).get("password") ?? "");
        const result = await call(sendJson("POST", "/api/password-reset/complete", { token, password }));
        if (result.ok) router.push("/sign-in?reset=done");
      }}
    >
      <FormMessage tone="error">{message?.text}</FormMessage>
      <div>
        <label htmlFor="password" className="field-label">
          New password (10 characters or more)
        </label>
        <input id="password" name="password" type="password" autoComplete="new-password" className="field-input mt-1" aria-describedby="password-error" />
        <FieldError id="password-error" messages={fields.password} />
      </div>
      <button type="submit" className="btn-primary">
        Save the new password
      </button>
    </form>
  );
}
