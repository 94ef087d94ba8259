import { SegmentNotFound } from "@/components/shell/segment-states";

export default function NotFound() {
  return <SegmentNotFound what="page" back={{ href: "/", label: "Back to the start" }} inMain />;
}
