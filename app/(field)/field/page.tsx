import { FieldHomeScreen } from "@/components/field/field-screens";

export const metadata = { title: "Field log" };

// The heading and the lead are in the server's HTML, so the page's largest text paints before any
// script runs; what the tablet holds fills in below them once its database has answered.
export default function FieldPage() {
  return (
    <main className="mx-auto grid max-w-6xl gap-6 px-4 py-6">
      <header className="grid gap-2">
        <h1 className="text-figure font-bold">Field log</h1>
        <p className="text-lead" data-testid="field-lead">
          Pours taken out to this tablet stay on it: open one and record each tendon end, with signal or without. Every
          record is sent by itself once the tablet has signal.
        </p>
      </header>
      <FieldHomeScreen />
    </main>
  );
}
