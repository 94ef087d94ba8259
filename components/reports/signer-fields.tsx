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
          <label htmlFor={id("name")} className="field-label">
            Your name as you sign
          </label>
          <input
            id={id("name")}
            name="signerName"
            defaultValue={signerName}
            className="field-input mt-1"
            aria-describedby={id("name-error")}
          />
          <FieldError id={id("name-error")} messages={fields.signerName} />
        </div>
        <div>
          <label htmlFor={id("licence")} className="field-label">
            Licence or certification number
          </label>
          <input
            id={id("licence")}
            name="licence"
            className="field-input mt-1"
            aria-describedby={id("licence-error")}
          />
          <FieldError id={id("licence-error")} messages={fields.licence} />
        </div>
      </div>
      <div>
        <label htmlFor={id("statement")} className="field-label">
          Statement
        </label>
        <textarea
          id={id("statement")}
          name="statement"
          rows={3}
          defaultValue={defaultStatement}
          className="field-input mt-1 py-2"
          aria-describedby={id("statement-error")}
        />
        <FieldError id={id("statement-error")} messages={fields.statement} />
      </div>
    </>
  );
}
