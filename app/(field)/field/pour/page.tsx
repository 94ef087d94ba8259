import { PourLogScreen } from "@/components/field/field-screens";

export const metadata = { title: "Tendons of a pour" };

// One page for every pour (?id=…&tendon=…), so the offline worker can keep it.
export default function PourPage() {
  return <PourLogScreen />;
}
