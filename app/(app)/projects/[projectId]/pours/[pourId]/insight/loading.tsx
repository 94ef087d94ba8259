export default function Loading() {
  return (
    <main className="space-y-4" aria-busy="true">
      <p className="text-lead font-semibold">Gathering the pour&apos;s records and working out the charts…</p>
      <div className="h-48 animate-pulse rounded-md bg-concrete-200" />
    </main>
  );
}
