import { SegmentNotFound } from "@/components/shell/segment-states";

export default function NotFound() {
  return <SegmentNotFound what="read-only link" back={{ href: "/", label: "Back to the start" }} inMain />;
}
