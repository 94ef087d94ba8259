import Link from "next/link";

/**
 * The states every office page shares, shown inside the signed-in layout so the navigation stays:
 * loading (what is being gathered), not found (what may have happened, and where to go).
 * The error state is in segment-error.tsx, since error boundaries run in the browser.
 * `inMain`: the layout already wraps its pages in <main> (the sign-in and public shells), so the
 * state is a plain block there; a page has one main landmark.
 */
export function SegmentLoading({ what, inMain = false }: { what: string; inMain?: boolean }) {
  const Wrapper = inMain ? "div" : "main";
  return (
    <Wrapper className="space-y-4" aria-busy="true">
      <p role="status" className="text-lead font-semibold">
        Gathering {what}…
      </p>
      <div className="h-10 w-2/3 animate-pulse rounded-md bg-concrete-200" />
      <div className="h-48 animate-pulse rounded-md bg-concrete-200" />
    </Wrapper>
  );
}

export function SegmentNotFound({
  what,
  back,
  inMain = false,
}: {
  what: string;
  back: { href: string; label: string };
  inMain?: boolean;
}) {
  const Wrapper = inMain ? "div" : "main";
  return (
    <Wrapper className="max-w-2xl space-y-4">
      <p className="field-label">Not found</p>
      <h1 className="text-figure font-bold">There is no {what} at this address.</h1>
      <p className="text-ink-soft">
        It may have been removed, the link may be cut short, or it belongs to a project you are not a member of. If
        someone sent you this link, ask them to check it.
      </p>
      <Link href={back.href} className="btn-primary">
        {back.label}
      </Link>
    </Wrapper>
  );
}
