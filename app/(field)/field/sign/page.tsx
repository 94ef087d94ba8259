import { FieldSigningScreen } from "@/components/field/field-screens";

export const metadata = { title: "Sign reports" };

// Static like the other field pages, so the offline worker keeps it and it can say why signing waits for signal.
export default function FieldSignPage() {
  return <FieldSigningScreen />;
}
