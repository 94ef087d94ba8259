export const FRACTIONS = ["1/8", "1/4", "3/8", "1/2", "5/8", "3/4", "7/8"];
/** The odd sixteenths, added to the keys while a finer reading is typed. */
export const SIXTEENTHS = ["1/16", "3/16", "5/16", "7/16", "9/16", "11/16", "13/16", "15/16"];

/** A fraction in sixteenths, for ordering the keys. */
function inSixteenths(fraction: string): number {
  const [n, d] = fraction.split("/").map(Number);
  return (n! * 16) / d!;
}

/**
 * What a box holds once a fraction key is pressed: the whole inches typed so far (0 when none)
 * and the fraction, any fraction already at its end replaced ("7 3/8" then 1/8 gives "7 1/8").
 */
export function withFraction(typed: string, fraction: string): string {
  return `${typed.replace(/\s*-?\s*\d+\/\d+\s*$/, "").trim() || "0"} ${fraction}`;
}

/**
 * One row of fraction keys for inch readings: the numeric keypad has no slash and gloves want big
 * keys. `target` names the box the keys write into; `onPick` gets the fraction (see `withFraction`).
 */
export function FractionKeys({
  target,
  onPick,
  fine = false,
}: {
  target: string;
  onPick: (fraction: string) => void;
  /** A finer reading is typed: the sixteenths join the eighths. */
  fine?: boolean;
}) {
  return (
    <div
      className="flex flex-wrap items-center gap-1"
      role="group"
      aria-label="Fraction keys"
      data-testid="fraction-keys"
    >
      <span className="mr-1 text-base text-ink-soft" aria-hidden="true">
        Fraction for <strong>{target}</strong>:
      </span>
      {(fine ? [...FRACTIONS, ...SIXTEENTHS].sort((a, b) => inSixteenths(a) - inSixteenths(b)) : FRACTIONS).map((f) => (
        <button key={f} type="button" className="btn-quiet min-w-touch px-2" onClick={() => onPick(f)}>
          {f}
        </button>
      ))}
    </div>
  );
}

/**
 * Fraction keys that write into an uncontrolled box found by its id (the office's forms read
 * their boxes from FormData), keeping the focus on the box.
 */
export function FractionKeysFor({ boxId, target, fine }: { boxId: string; target: string; fine?: boolean }) {
  return (
    <FractionKeys
      target={target}
      fine={fine}
      onPick={(fraction) => {
        const box = document.getElementById(boxId);
        if (!(box instanceof HTMLInputElement)) return;
        box.value = withFraction(box.value, fraction);
        box.focus();
      }}
    />
  );
}
