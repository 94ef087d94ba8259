import { FieldHome } from "@/components/field/field-home";

export const metadata = { title: "Field log" };

export default function FieldPage() {
  return <FieldHome />;
}
