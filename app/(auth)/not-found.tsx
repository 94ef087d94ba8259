import { SegmentNotFound } from "@/components/shell/segment-states";

export default function NotFound() {
  return <SegmentNotFound what="page" back={{ href: "/sign-in", label: "Go to sign in" }} inMain />;
}
