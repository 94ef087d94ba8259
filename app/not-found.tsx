import Link from "next/link";

export default function NotFound() {
  return (
    <main className="mx-auto max-w-xl px-6 py-20">
      <p className="field-label">Not found</p>
      <h1 className="mt-2 text-figure font-bold">There is nothing at this address.</h1>
      <p className="mt-4 text-ink-soft">
        The page may have moved, or the pour or tendon it pointed to is not on a project you belong to.
      </p>
      <Link href="/" className="btn-primary mt-8">
        Back to the start
      </Link>
    </main>
  );
}
