/** "1 tendon", "2 tendons", "0 tendons": a count with its noun in the right number. */
export function countOf(n: number, singular: string, plural = `${singular}s`): string {
  return `${n} ${n === 1 ? singular : plural}`;
}
