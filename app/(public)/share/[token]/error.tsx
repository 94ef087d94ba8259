"use client";

import { SegmentError } from "@/components/shell/segment-error";

export default function ErrorState({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <SegmentError what="The pours' status" error={error} reset={reset} inMain />;
}
