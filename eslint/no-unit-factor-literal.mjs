/**
 * Refuses a number literal that is one of the unit conversion factors of `lib/units/factors.ts`
 * (or its reciprocal, or either shifted by a power of ten: 0.0254 m per inch, 6894.757 Pa per psi,
 * 3.2808 ft per m, 145.04 psi per MPa, 10.7639 ft² per m²), so every conversion goes through `lib/units`.
 *
 * A literal matches when its significant digits are those of a factor: the defined factors match
 * exactly (25.4, 304.8, 0.3048, 645.16, 4.4482216152605, …) or rounded to four figures or more
 * (4.44822, 6.8948); the reciprocals, which no one writes exactly, match from four figures on
 * (3.2808, 145.0377). Shorter roundings (4.45, 6.89, 3.28) are ordinary numbers and pass.
 * A whole number matches from four figures on (3048 mm is 10 ft; 254 is more often a length limit).
 * MPA_PER_BAR (0.1) is a factor too but also every tenth in the code, so it is left out.
 */

/** The defined factors of lib/units/factors.ts, bar excepted (see above). */
export const UNIT_FACTORS = [
  25.4, 304.8, 645.16, 0.09290304, 4.4482216152605, 4448.2216152605, 0.006894757293168, 6.894757293168, 0.3048,
];

const mantissa = (value) => {
  const exponent = Math.floor(Math.log10(Math.abs(value)));
  return { m: Math.abs(value) / 10 ** exponent, exponent };
};

const DEFINED = [...new Set(UNIT_FACTORS.map((f) => Number(mantissa(f).m.toPrecision(14))))];
const RECIPROCALS = [...new Set(UNIT_FACTORS.map((f) => Number(mantissa(1 / f).m.toPrecision(14))))];

/** Significant digits as written: "0.3048" → 4, "4448.22" → 6, "1550" → 3, "1.5e3" → 2. */
function significantDigits(raw) {
  const digits = raw.toLowerCase().replace(/_/g, "").split("e")[0].replace(/^[+-]/, "");
  if (digits.includes(".")) return digits.replace(".", "").replace(/^0+/, "").length;
  return digits.replace(/^0+/, "").replace(/0+$/, "").length;
}

/** The factor the literal spells, or undefined. */
export function unitFactorOf(value, raw) {
  if (typeof value !== "number" || !Number.isFinite(value) || value === 0) return undefined;
  const { m } = mantissa(value);
  const digits = significantDigits(raw);
  // One unit of the literal's last written digit, on the mantissa's scale.
  const lastDigit = 10 ** -(Math.max(digits, 1) - 1);
  // A whole number needs four figures (3048, 4448): 254 is a length limit before it is 10 in.
  const whole = !/[.e]/i.test(raw);
  for (const f of DEFINED) {
    if (Math.abs(m - f) < 1e-9 && (!whole || digits >= 4)) return f;
    if (digits >= 4 && Math.abs(m - f) <= lastDigit) return f;
  }
  for (const f of RECIPROCALS) {
    if (digits >= 4 && Math.abs(m - f) <= lastDigit) return f;
  }
  return undefined;
}

const rule = {
  meta: {
    type: "problem",
    docs: { description: "Unit conversion factors are imported from lib/units, never written out." },
    messages: {
      factor:
        "{{raw}} is a unit conversion factor: import it from lib/units (MM_PER_INCH, MPA_PER_PSI, …) or format through lib/format/quantities.",
    },
    schema: [],
  },
  create(context) {
    return {
      Literal(node) {
        if (typeof node.value !== "number") return;
        if (unitFactorOf(node.value, node.raw) !== undefined) {
          context.report({ node, messageId: "factor", data: { raw: node.raw } });
        }
      },
    };
  },
};

export default rule;
