"use client";
import { useState } from "react";
import type { LocalPhoto } from "@/lib/offline/db";

/** A photo as the tablet will store it, with a preview URL until it is saved. */
export type PickedPhoto = Pick<
  LocalPhoto,
  "id" | "blob" | "contentType" | "sizeBytes" | "width" | "height" | "takenAt"
> & {
  url: string;
};

const MAX_EDGE = 1600;

/** Scales a camera photo down to at most 1600 px on its long edge and re-encodes it as JPEG. */
async function resize(file: File): Promise<PickedPhoto> {
  const bitmap = await createImageBitmap(file);
  const scale = Math.min(1, MAX_EDGE / Math.max(bitmap.width, bitmap.height));
  const width = Math.round(bitmap.width * scale);
  const height = Math.round(bitmap.height * scale);
  const canvas = document.createElement("canvas");
  canvas.width = width;
  canvas.height = height;
  canvas.getContext("2d")!.drawImage(bitmap, 0, 0, width, height);
  bitmap.close();
  const blob = await new Promise<Blob>((resolve, reject) =>
    canvas.toBlob((b) => (b ? resolve(b) : reject(new Error("The photo could not be read."))), "image/jpeg", 0.82),
  );
  return {
    id: crypto.randomUUID(),
    blob,
    contentType: "image/jpeg",
    sizeBytes: blob.size,
    width,
    height,
    takenAt: new Date().toISOString(),
    url: URL.createObjectURL(blob),
  };
}

export function PhotoPicker({
  photos,
  onChange,
}: {
  photos: PickedPhoto[];
  onChange: (photos: PickedPhoto[]) => void;
}) {
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  return (
    <fieldset className="grid gap-2">
      <legend className="field-label">Photos (gauge, marks)</legend>
      <label className="btn-quiet w-fit cursor-pointer">
        {busy ? "Preparing photo…" : "Take or add a photo"}
        <input
          type="file"
          accept="image/*"
          capture="environment"
          multiple
          className="sr-only"
          onChange={async (e) => {
            const files = [...(e.target.files ?? [])];
            e.target.value = "";
            setBusy(true);
            setError(null);
            try {
              onChange([...photos, ...(await Promise.all(files.map(resize)))]);
            } catch (err) {
              setError((err as Error).message);
            } finally {
              setBusy(false);
            }
          }}
        />
      </label>
      {error && <p className="text-signal-stop">{error}</p>}
      {photos.length > 0 && (
        <ul className="flex flex-wrap gap-2">
          {photos.map((p) => (
            <li key={p.id} className="grid gap-1">
              {/* eslint-disable-next-line @next/next/no-img-element -- a local blob, not a served image */}
              <img src={p.url} alt="Photo to keep with this record" className="h-24 w-24 rounded-md object-cover" />
              <button
                type="button"
                className="btn-quiet"
                onClick={() => {
                  URL.revokeObjectURL(p.url);
                  onChange(photos.filter((x) => x.id !== p.id));
                }}
              >
                Remove
              </button>
            </li>
          ))}
        </ul>
      )}
      <p className="text-label text-ink-faint">
        Stored on the tablet with the record; uploaded after the record reaches the server.
      </p>
    </fieldset>
  );
}
