/**
 * The one guard every CSV Tautline writes puts on its cells (OWASP "CSV injection"): a cell that
 * starts with =, +, -, @, a tab or a carriage return is one a spreadsheet may run as a formula,
 * so it gets a leading apostrophe and opens as text. A plain signed number ("-3", "+1.2 %") is
 * not a formula and stays as it is; "-1+2", "-1+cmd|..." and "@SUM(...)" do not.
 */
export const FORMULA_TRIGGER = /^[=+\-@\t\r]/;

const PLAIN_NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:\s?%)?$/;

export function safeCell(value: string): string {
  return FORMULA_TRIGGER.test(value) && !PLAIN_NUMBER.test(value) ? `'${value}` : value;
}

/** Every cell of a table through safeCell. */
export function safeRows(rows: readonly (readonly string[])[]): string[][] {
  return rows.map((row) => row.map(safeCell));
}
