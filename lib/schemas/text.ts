import { z } from "zod";

/**
 * The one text schema for everything a person types. PostgreSQL cannot store NUL in text or
 * JSON, and other control characters only ever arrive by accident or on purpose to break a
 * screen, a CSV or a log; both are refused with a message on the field. Tab, line feed and
 * carriage return stay allowed inside multi-line text.
 */
export const CONTROL_CHARACTERS = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/;

export const CONTROL_CHARACTERS_MESSAGE =
  "Remove the control characters (such as NUL) from this text: they cannot be stored.";

export const hasControlCharacters = (value: string): boolean => CONTROL_CHARACTERS.test(value);

/** `z.string()` that refuses control characters; chain `.trim()`, `.min()`, `.max()` as usual. */
export function text(params?: Parameters<typeof z.string>[0]) {
  return z.string(params).refine((v) => !hasControlCharacters(v), CONTROL_CHARACTERS_MESSAGE);
}
