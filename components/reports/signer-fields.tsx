import { FormField } from "@/components/ui/form-field";

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
        <FormField
          id={id("name")}
          name="signerName"
          label="Your name as you sign"
          defaultValue={signerName}
          error={fields.signerName}
        />
        <FormField id={id("licence")} name="licence" label="Licence or certification number" error={fields.licence} />
      </div>
      <FormField
        as="textarea"
        id={id("statement")}
        name="statement"
        label="Statement"
        rows={3}
        defaultValue={defaultStatement}
        error={fields.statement}
      />
    </>
  );
}
