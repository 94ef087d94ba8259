"use client";

import { SegmentError } from "@/components/shell/segment-error";

export default function ErrorState({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div className="mx-auto max-w-6xl px-4 py-6">
      <SegmentError what="This screen of the field log" error={error} reset={reset} />
    </div>
  );
}
