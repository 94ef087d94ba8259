import { SegmentLoading } from "@/components/shell/segment-states";

export default function Loading() {
  return <SegmentLoading what="the equipment sets and their calibrations" />;
}
