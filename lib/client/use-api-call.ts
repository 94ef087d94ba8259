import { useState } from "react";
import { placeFields, refusedWords } from "./field-errors";
import type { ApiResult } from "./send-json";

export interface FormNotice {
  tone: "error" | "info";
  text: string;
}

/** The boxes a form shows: their names as the route names its fields, or a path → box mapping. */
export type Shown = readonly string[] | ((path: string) => string | null | undefined);

/**
 * The state every form that calls a route handler keeps: the message above the form, each
 * field's messages from a 422, and whether a call is under way. `done` is the message shown when
 * the call succeeds; leave it out when the form moves on instead. With `shown` (the boxes the
 * form has), a 422's messages are kept by box and those no box shows go above the form, in the
 * user's words, never under the schema's field names.
 */
export function useApiCall(shown?: Shown) {
  const [message, setMessage] = useState<FormNotice>();
  const [fields, setFields] = useState<Record<string, string[]>>({});
  const [busy, setBusy] = useState(false);

  async function call<T>(request: Promise<ApiResult<T>>, done?: string | ((data: T) => string)): Promise<ApiResult<T>> {
    setBusy(true);
    const result = await request;
    setBusy(false);
    if (!result.ok) {
      if (shown === undefined) {
        setMessage({ tone: "error", text: result.error.message });
        setFields(result.error.fields ?? {});
        return result;
      }
      const boxOf = typeof shown === "function" ? shown : (path: string) => (shown.includes(path) ? path : null);
      const placed = placeFields(result.error.fields, boxOf);
      setMessage({ tone: "error", text: refusedWords(result.error, placed) });
      setFields(placed.boxes);
      return result;
    }
    setFields({});
    setMessage(
      done === undefined ? undefined : { tone: "info", text: typeof done === "function" ? done(result.data) : done },
    );
    return result;
  }

  /** Messages found before sending (a length that cannot be read), shown as a refusal would be. */
  function refuse(boxes: Record<string, string[]>) {
    setFields(boxes);
    setMessage({ tone: "error", text: refusedWords({ message: "", fields: boxes }, { boxes, rest: [] }) });
  }

  return { message, fields, busy, call, refuse };
}
