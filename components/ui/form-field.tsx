import type { ComponentPropsWithRef, ReactNode } from "react";
import { FieldError } from "./form-message";

/** One message, a list of them (a route's 422 `fields`), or nothing. */
export type FieldMessages = string | readonly string[] | null | undefined;

const listed = (error: FieldMessages): string[] =>
  !error ? [] : typeof error === "string" ? [error] : error.filter(Boolean);

export interface FieldFrame {
  /** The control's id; the hint is `${id}-hint`, the error `${id}-error`, the unit `${id}-unit`. */
  id: string;
  label: ReactNode;
  /** A line under the control that helps fill it in. */
  hint?: ReactNode;
  /** What is wrong, in the user's words; the control is marked invalid while there is any. */
  error?: FieldMessages;
  /** The unit a typed number is read in, shown after the box (the label may say it too). */
  unit?: ReactNode;
  /** Classes of the block that holds the label, the control and the messages. */
  frameClassName?: string;
  /** Messages shown elsewhere that also speak of this control (a list's one message under its rows). */
  alsoDescribedBy?: string;
  /** Read the error out as it appears (the tablet's forms, used with gloves and without looking). */
  announce?: boolean;
}

/** What a control needs to be read with its hint, unit and error by a screen reader. */
export interface FieldAria {
  id: string;
  "aria-invalid": true | undefined;
  "aria-describedby": string | undefined;
}

export function fieldAria(
  id: string,
  { hint, error, unit, alsoDescribedBy }: Pick<FieldFrame, "hint" | "error" | "unit" | "alsoDescribedBy">,
): FieldAria {
  const described = [
    unit ? `${id}-unit` : null,
    hint ? `${id}-hint` : null,
    listed(error).length ? `${id}-error` : null,
    alsoDescribedBy ?? null,
  ]
    .filter(Boolean)
    .join(" ");
  return {
    id,
    "aria-invalid": listed(error).length || alsoDescribedBy ? true : undefined,
    "aria-describedby": described || undefined,
  };
}

/**
 * The frame of a form field for a control of its own (a box with a unit choice beside it, a
 * checkbox): the label, the control `children` renders with the ids and states it is given, the
 * hint and the error under it. Plain boxes, choices and text areas use `FormField`.
 */
export function Field({
  id,
  label,
  hint,
  error,
  unit,
  frameClassName,
  alsoDescribedBy,
  announce,
  children,
}: FieldFrame & { children: (aria: FieldAria) => ReactNode }) {
  const aria = fieldAria(id, { hint, error, unit, alsoDescribedBy });
  return (
    <div className={frameClassName}>
      <label htmlFor={id} className="field-label">
        {label}
      </label>
      <div className={unit ? "mt-1 flex items-center gap-2" : "mt-1"}>
        {children(aria)}
        {unit && (
          <span id={`${id}-unit`} className="shrink-0 text-ink-soft">
            {unit}
          </span>
        )}
      </div>
      {hint && (
        <p id={`${id}-hint`} className="mt-1 text-label text-ink-faint">
          {hint}
        </p>
      )}
      <FieldError id={`${id}-error`} messages={listed(error)} alert={announce} />
    </div>
  );
}

type InputProps = Omit<ComponentPropsWithRef<"input">, "id"> & {
  as?: "input";
  /** Numbers are typed here: the tablet shows its numeric keypad ("integer": no decimal point). */
  numeric?: boolean | "integer";
};
type SelectProps = Omit<ComponentPropsWithRef<"select">, "id"> & { as: "select" };
type TextareaProps = Omit<ComponentPropsWithRef<"textarea">, "id"> & { as: "textarea" };

/** The control's own props, without the choice of control. */
function withoutAs<T extends { as?: string }>(control: T): Omit<T, "as"> {
  const rest = { ...control };
  delete rest.as;
  return rest;
}

/**
 * The one form field: label, optional hint, the control (a box, a choice or a text area), an
 * optional unit after it and the error under it, the hint and error tied to the control with
 * `aria-describedby` and the control marked `aria-invalid` while in error. It takes
 * react-hook-form's `register(...)` spread into it, or `name`/`defaultValue` in an uncontrolled
 * form. `className` adds to the control's own classes.
 */
export function FormField(props: FieldFrame & (InputProps | SelectProps | TextareaProps)) {
  const { id, label, hint, error, unit, frameClassName, alsoDescribedBy, announce, className, ...control } = props;
  const classes = `field-input${className ? ` ${className}` : ""}`;
  return (
    <Field
      id={id}
      label={label}
      hint={hint}
      error={error}
      unit={unit}
      frameClassName={frameClassName}
      alsoDescribedBy={alsoDescribedBy}
      announce={announce}
    >
      {(aria) => {
        if (control.as === "select") return <select {...withoutAs(control)} {...aria} className={classes} />;
        if (control.as === "textarea")
          return <textarea {...withoutAs(control)} {...aria} className={`${classes} py-2`} />;
        const { numeric, ...rest } = withoutAs(control);
        const keypad = numeric ? { inputMode: numeric === "integer" ? "numeric" : "decimal", autoComplete: "off" } : {};
        return <input {...(keypad as object)} {...rest} {...aria} className={classes} />;
      }}
    </Field>
  );
}
