/** A part of a page under its own heading, which names the region for assistive technology too. */
export function Section({
  id,
  title,
  className = "space-y-3",
  children,
}: {
  /** The heading's id. */
  id: string;
  title: React.ReactNode;
  className?: string;
  children: React.ReactNode;
}) {
  return (
    <section aria-labelledby={id} className={className}>
      <h2 id={id} className="text-lead font-bold">
        {title}
      </h2>
      {children}
    </section>
  );
}
