import { CompiledQuery, type Compilable, type Kysely } from "kysely";
import type { Database } from "./types";

/**
 * A query of fixed shape, built and compiled once and then run with each call's arguments in
 * place of the placeholders it was built with. Building and compiling a large Kysely select
 * costs more than running it on a warm connection; the sync push runs one such read per record.
 *
 * Every argument must reach the query as a bound parameter, never as SQL text (checked when it is
 * compiled), and the query's shape must not depend on the arguments' values.
 */
export function reusableQuery<K extends string, O>(
  keys: readonly K[],
  build: (db: Kysely<Database>, args: Record<K, string>) => Compilable<O>,
) {
  let compiled: { sql: string; slots: ({ key: K } | { value: unknown })[] } | null = null;
  const marker = (key: string) => `\u0000arg:${key}\u0000`;

  function compile(db: Kysely<Database>) {
    const placeholders = Object.fromEntries(keys.map((k) => [k, marker(k)])) as Record<K, string>;
    const built = build(db, placeholders).compile();
    if (built.sql.includes("\u0000")) throw new Error("a reusable query's argument reached its SQL text");
    const slots = built.parameters.map((value) => {
      const key = keys.find((k) => value === marker(k));
      return key ? { key } : { value };
    });
    const missing = keys.filter((k) => !slots.some((s) => "key" in s && s.key === k));
    if (missing.length) throw new Error(`a reusable query does not use its argument(s) ${missing.join(", ")}`);
    return { sql: built.sql, slots };
  }

  return {
    async executeTakeFirst(db: Kysely<Database>, args: Record<K, string>): Promise<O | undefined> {
      compiled ??= compile(db);
      const parameters = compiled.slots.map((s) => ("key" in s ? args[s.key] : s.value));
      const result = await db.executeQuery<O>(CompiledQuery.raw(compiled.sql, parameters) as CompiledQuery<O>);
      return result.rows[0];
    },
  };
}
