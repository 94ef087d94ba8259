"use client";

import { SegmentError } from "@/components/shell/segment-error";

export default function ErrorState({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return <SegmentError what="This page" error={error} reset={reset} inMain />;
}
