/** "F-0012", "D-0007": a flag's or a disposition's number in its project, in the order they were made. */
export const reference = (prefix: "F" | "D", n: number): string => `${prefix}-${String(n).padStart(4, "0")}`;
