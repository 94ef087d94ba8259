"use client";

import { SegmentError } from "@/components/shell/segment-error";

export default function ErrorState({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <SegmentError what="The read-only links" error={error} reset={reset} />;
}
