import { FieldSigning } from "@/components/field/field-signing";

export const metadata = { title: "Sign reports" };

// Static like the other field pages, so the offline worker keeps it and it can say why signing waits for signal.
export default function FieldSignPage() {
  return <FieldSigning />;
}
