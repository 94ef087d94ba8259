import { z } from "zod/mini";

/**
 * The rule every text a person types passes. PostgreSQL cannot store NUL in text or JSON, and
 * other control characters only ever arrive by accident or on purpose to break a screen, a CSV or
 * a log; both are refused with a message on the field. Tab, line feed and carriage return stay
 * allowed inside multi-line text. Written with `zod/mini`, whose checks the full API's schemas take
 * too: `text()` (./text.ts) adds it to a `z.string()`, and the schemas the tablet reads stored
 * records with (./stored-entered.ts) use it without loading zod's full API.
 */
export const CONTROL_CHARACTERS = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/;

export const CONTROL_CHARACTERS_MESSAGE =
  "Remove the control characters (such as NUL) from this text: they cannot be stored.";

export const hasControlCharacters = (value: string): boolean => CONTROL_CHARACTERS.test(value);

/** The check that refuses control characters, for any zod string schema (`.check(noControlCharacters())`). */
export const noControlCharacters = () => z.refine<string>((v) => !hasControlCharacters(v), CONTROL_CHARACTERS_MESSAGE);
