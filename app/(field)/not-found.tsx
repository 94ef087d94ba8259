import { SegmentNotFound } from "@/components/shell/segment-states";

export default function NotFound() {
  return (
    <div className="mx-auto max-w-6xl px-4 py-6">
      <SegmentNotFound what="screen of the field log" back={{ href: "/field", label: "Open the field log" }} />
    </div>
  );
}
