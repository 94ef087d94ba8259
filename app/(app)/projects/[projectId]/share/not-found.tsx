import { SegmentNotFound } from "@/components/shell/segment-states";

export default function NotFound() {
  return <SegmentNotFound what="page" back={{ href: "/home", label: "Back to your home page" }} />;
}
