import { SegmentLoading } from "@/components/shell/segment-states";

export default function Loading() {
  return <SegmentLoading what="the project's read-only links" />;
}
