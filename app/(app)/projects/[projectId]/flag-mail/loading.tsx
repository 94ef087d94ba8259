import { SegmentLoading } from "@/components/shell/segment-states";

export default function Loading() {
  return <SegmentLoading what="your flag e-mail choice" />;
}
