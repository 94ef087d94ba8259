export const metadata = { title: "No signal" };

// What the offline worker shows for a page it does not keep.
export default function OfflinePage() {
  return (
    <main className="mx-auto grid max-w-2xl gap-4 px-4 py-10">
      <h1 className="text-figure font-bold">No signal for this page</h1>
      <p className="text-lead">
        This screen needs a connection. The field log works without one: your pours, tendons and records are on this
        tablet, and what you record is sent when the signal comes back.
      </p>
      <a className="btn-primary w-fit" href="/field">
        Open the field log
      </a>
    </main>
  );
}
