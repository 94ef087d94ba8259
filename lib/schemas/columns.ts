/**
 * A DTO's columns named with their table, for a select that joins tables sharing column names
 * (`.select([...qualified("tendons", TENDON_COLUMNS), "strand_lots.lot_number"])`): the rows keep
 * the plain names the row mapper reads.
 */
export function qualified<T extends string, C extends string>(table: T, columns: readonly C[]): `${T}.${C}`[] {
  return columns.map((c) => `${table}.${c}` as `${T}.${C}`);
}

/** The part of a DTO a reader keeps, its keys in the order given (`pick(tendon, ["id", "tag"])`). */
export function pick<T extends object, K extends keyof T>(from: T, keys: readonly K[]): Pick<T, K> {
  return Object.fromEntries(keys.map((k) => [k, from[k]])) as Pick<T, K>;
}
