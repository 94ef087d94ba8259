import { FieldHomeScreen } from "@/components/field/field-screens";

export const metadata = { title: "Field log" };

export default function FieldPage() {
  return <FieldHomeScreen />;
}
