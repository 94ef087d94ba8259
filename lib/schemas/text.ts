import { z } from "zod";
import { noControlCharacters } from "./text-check";

export { CONTROL_CHARACTERS, CONTROL_CHARACTERS_MESSAGE, hasControlCharacters } from "./text-check";

/**
 * The one text schema for everything a person types (the rule is in ./text-check.ts):
 * `z.string()` that refuses control characters; chain `.trim()`, `.min()`, `.max()` as usual.
 */
export function text(params?: Parameters<typeof z.string>[0]) {
  return z.string(params).check(noControlCharacters());
}
