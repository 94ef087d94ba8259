"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { FieldError, FormMessage } from "@/components/ui/form-message";
import { sendJson } from "@/lib/client/send-json";

export function RequestResetForm() {
  const [message, setMessage] = useState<{ tone: "error" | "info"; text: string }>();
  const [fields, setFields] = useState<Record<string, string[]>>({});
  return (
    <form
      className="space-y-5"
      onSubmit={async (e) => {
        e.preventDefault();
        const email = String(new FormData(e.currentTarget).get("email") ?? "");
        const result = await sendJson<{ message: string }>("POST", "/api/password-reset", { email });
        setFields(result.ok ? {} : (result.error.fields ?? {}));
        setMessage(result.ok ? { tone: "info", text: result.data.message } : { tone: "error", text: result.error.message });
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
  const [error, setError] = useState<string>();
  const [fields, setFields] = useState<Record<string, string[]>>({});
  return (
    <form
      className="space-y-5"
      onSubmit={async (e) => {
        e.preventDefault();
        const password = String(new FormData(e.currentTarget).get("password") ?? "");
        const result = await sendJson("POST", "/api/password-reset/complete", { token, password });
        if (result.ok) return router.push("/sign-in?reset=done");
        setError(result.error.message);
        setFields(result.error.fields ?? {});
      }}
    >
      <FormMessage tone="error">{error}</FormMessage>
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
