import { FieldError } from "@/components/ui/form-message";

/**
 * What every signature asks of its signer, the same on the stressing report and the day's
 * inspection report: the name as they sign, their licence or certification number and the
 * statement, each with its error tied to the box. Uncontrolled: the form reads them by name.
 */
export function SignerFields({
  id,
  signerName,
  defaultStatement,
  fields,
}: {
  id: (part: string) => string;
  signerName: string;
  defaultStatement: string;
  fields: Partial<Record<string, string[]>>;
}) {
  return (
    <>
      <div className="grid gap-3 md:grid-cols-2">
        <div>
          <label htmlFor={id("sign-name")} className="field-label">
            Your name as you sign
          </label>
          <input
            id={id("sign-name")}
            name="signerName"
            defaultValue={signerName}
            className="field-input mt-1"
            aria-describedby={id("sign-name-error")}
          />
          <FieldError id={id("sign-name-error")} messages={fields.signerName} />
        </div>
        <div>
          <label htmlFor={id("sign-licence")} className="field-label">
            Licence or certification number
          </label>
          <input
            id={id("sign-licence")}
            name="licence"
            className="field-input mt-1"
            aria-describedby={id("sign-licence-error")}
          />
          <FieldError id={id("sign-licence-error")} messages={fields.licence} />
        </div>
      </div>
      <div>
        <label htmlFor={id("sign-statement")} className="field-label">
          Statement
        </label>
        <textarea
          id={id("sign-statement")}
          name="statement"
          rows={3}
          defaultValue={defaultStatement}
          className="field-input mt-1 py-2"
          aria-describedby={id("sign-statement-error")}
        />
        <FieldError id={id("sign-statement-error")} messages={fields.statement} />
      </div>
    </>
  );
}
