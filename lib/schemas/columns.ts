/**
 * A DTO's columns named with their table, for a select that joins tables sharing column names
 * (`.select([...qualified("tendons", TENDON_COLUMNS), "strand_lots.lot_number"])`): the rows keep
 * the plain names the row mapper reads.
 */
export function qualified<T extends string, C extends string>(table: T, columns: readonly C[]): `${T}.${C}`[] {
  return columns.map((c) => `${table}.${c}` as `${T}.${C}`);
}
