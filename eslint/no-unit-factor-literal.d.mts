import type { Rule } from "eslint";

export const UNIT_FACTORS: readonly number[];
export function unitFactorOf(value: unknown, raw: string): number | undefined;
declare const rule: Rule.RuleModule;
export default rule;
