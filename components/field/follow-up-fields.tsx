/**
 * The parts the tablet's follow-up forms share (the lift-off check and the detension): a field's
 * problem tied to its box, and the choice of the equipment set that was on the tendon.
 */

export function Problem({ id, message }: { id: string; message: string | undefined }) {
  if (!message) return null;
  return (
    <p id={id} role="alert" className="mt-1 font-semibold text-signal-stop">
      {message}
    </p>
  );
}

export function SetChoice({
  name,
  sets,
  value,
  onChange,
  errorId,
  error,
}: {
  /** The radio group's name, one per form. */
  name: string;
  sets: { id: string; name: string; gaugeSerial: string }[];
  value: string;
  onChange: (setId: string) => void;
  errorId: string;
  error: string | undefined;
}) {
  return (
    <fieldset aria-describedby={error ? errorId : undefined}>
      <legend className="field-label">Equipment set</legend>
      <div className="mt-1 grid gap-2">
        {sets.length === 0 && <p>No equipment sets were downloaded with this pour.</p>}
        {sets.map((s) => (
          <label
            key={s.id}
            className="flex min-h-touch cursor-pointer items-center gap-3 rounded-md border-2 border-concrete-500 px-3 has-checked:border-ink has-checked:bg-concrete-100"
          >
            <input
              type="radio"
              name={name}
              value={s.id}
              className="h-6 w-6"
              checked={value === s.id}
              onChange={() => onChange(s.id)}
            />
            <span>
              <strong>{s.name}</strong> · gauge {s.gaugeSerial}
            </span>
          </label>
        ))}
      </div>
      <Problem id={errorId} message={error} />
    </fieldset>
  );
}
