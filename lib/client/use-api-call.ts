import { useState } from "react";
import type { ApiResult } from "./send-json";

export interface FormNotice {
  tone: "error" | "info";
  text: string;
}

/**
 * The state every form that calls a route handler keeps: the message above the form, each
 * field's messages from a 422, and whether a call is under way. `done` is the message shown when
 * the call succeeds; leave it out when the form moves on instead.
 */
export function useApiCall() {
  const [message, setMessage] = useState<FormNotice>();
  const [fields, setFields] = useState<Record<string, string[]>>({});
  const [busy, setBusy] = useState(false);

  async function call<T>(request: Promise<ApiResult<T>>, done?: string | ((data: T) => string)): Promise<ApiResult<T>> {
    setBusy(true);
    const result = await request;
    setBusy(false);
    if (!result.ok) {
      setMessage({ tone: "error", text: result.error.message });
      setFields(result.error.fields ?? {});
      return result;
    }
    setFields({});
    setMessage(
      done === undefined ? undefined : { tone: "info", text: typeof done === "function" ? done(result.data) : done },
    );
    return result;
  }

  return { message, fields, busy, call };
}
