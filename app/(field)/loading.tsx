import { SegmentLoading } from "@/components/shell/segment-states";

// The tablet's pages are static; this shows only while a page's code is still arriving.
export default function Loading() {
  return (
    <div className="mx-auto max-w-6xl px-4 py-6">
      <SegmentLoading what="the field log" />
    </div>
  );
}
