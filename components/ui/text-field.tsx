import type { InputHTMLAttributes, ReactNode } from "react";
import { FieldError } from "./form-message";

type Shared = { id: string; label: ReactNode; errors?: string[] };

/**
 * A labelled text box of an uncontrolled form with its error under it, the error always tied to
 * the box (aria-describedby) so a screen reader reads it with the field. `rows` makes it a
 * textarea.
 */
export function TextField({
  id,
  label,
  errors,
  rows,
  ...input
}: Shared & { rows?: number } & Omit<InputHTMLAttributes<HTMLInputElement>, "id" | "className">) {
  const errorId = `${id}-error`;
  return (
    <div>
      <label htmlFor={id} className="field-label">
        {label}
      </label>
      {rows ? (
        <textarea
          id={id}
          name={input.name}
          rows={rows}
          placeholder={input.placeholder}
          className="field-input mt-1 py-2"
          aria-describedby={errorId}
        />
      ) : (
        <input id={id} {...input} className="field-input mt-1" aria-describedby={errorId} />
      )}
      <FieldError id={errorId} messages={errors} />
    </div>
  );
}
