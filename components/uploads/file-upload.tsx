"use client";

import { useId, useState } from "react";
import { sendJson } from "@/lib/client/send-json";
import type { UploadPurpose } from "@/lib/schemas/domain";
import { ALLOWED_TYPES, PURPOSE_LABELS, acceptedTypesText } from "@/lib/schemas/upload";

export interface UploadedFile {
  id: string;
  originalName: string | null;
  sizeBytes: number;
  sha256: string;
}

interface Presigned {
  attachmentId: string;
  uploadUrl: string;
  headers: Record<string, string>;
}

/** PUT with progress: fetch cannot report upload progress, XMLHttpRequest can. */
function putWithProgress(
  url: string,
  file: File,
  headers: Record<string, string>,
  onProgress: (fraction: number) => void,
): Promise<number> {
  return new Promise((resolve) => {
    const xhr = new XMLHttpRequest();
    xhr.open("PUT", url);
    for (const [k, v] of Object.entries(headers)) xhr.setRequestHeader(k, v);
    xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(e.loaded / e.total);
    xhr.onload = () => resolve(xhr.status);
    xhr.onerror = () => resolve(0);
    xhr.send(file);
  });
}

/**
 * Picks a file, sends it straight to storage on a presigned URL with a progress bar, then asks
 * the server to check it (type by content, size, sha256). Calls onUploaded with the stored file.
 */
export function FileUpload(props: {
  projectId: string;
  purpose: UploadPurpose;
  label: string;
  onUploaded: (file: UploadedFile) => void;
}) {
  const id = useId();
  const [progress, setProgress] = useState<number | null>(null);
  const [state, setState] = useState<{ tone: "error" | "info"; text: string } | null>(null);

  async function upload(file: File) {
    setState(null);
    setProgress(0);
    const base = `/api/projects/${props.projectId}`;
    const started = await sendJson<Presigned>("POST", `${base}/uploads`, {
      purpose: props.purpose,
      contentType: file.type || "application/octet-stream",
      sizeBytes: file.size,
      originalName: file.name,
    });
    if (!started.ok) {
      setProgress(null);
      const fieldText = Object.values(started.error.fields ?? {})
        .flat()
        .join(" ");
      setState({ tone: "error", text: fieldText || started.error.message });
      return;
    }
    const status = await putWithProgress(started.data.uploadUrl, file, started.data.headers, setProgress);
    if (status < 200 || status >= 300) {
      setProgress(null);
      setState({
        tone: "error",
        text:
          status === 0
            ? "The file could not reach storage. Check the connection and try again."
            : `Storage answered ${status}. Try again.`,
      });
      return;
    }
    const confirmed = await sendJson<{ attachment: UploadedFile }>(
      "POST",
      `${base}/uploads/${started.data.attachmentId}/confirm`,
    );
    setProgress(null);
    if (!confirmed.ok) {
      setState({ tone: "error", text: confirmed.error.message });
      return;
    }
    setState({ tone: "info", text: `Uploaded and checked: ${file.name}.` });
    props.onUploaded(confirmed.data.attachment);
  }

  return (
    <div>
      <label htmlFor={id} className="field-label">
        {props.label}
      </label>
      <input
        id={id}
        type="file"
        accept={ALLOWED_TYPES[props.purpose].join(",")}
        className="field-input mt-1 py-2"
        aria-describedby={`${id}-hint`}
        onChange={(e) => {
          const file = e.currentTarget.files?.[0];
          if (file) void upload(file);
        }}
      />
      <p id={`${id}-hint`} className="mt-1 text-label text-ink-faint">
        A {PURPOSE_LABELS[props.purpose]}: {acceptedTypesText(props.purpose)}. The content is checked, not just the
        name.
      </p>
      {progress !== null && (
        <div className="mt-2">
          <progress className="h-4 w-full" max={1} value={progress} aria-label="Upload progress" />
          <p className="text-label">Uploading… {Math.round(progress * 100)} %</p>
        </div>
      )}
      {state && (
        <p
          role={state.tone === "error" ? "alert" : "status"}
          className={state.tone === "error" ? "mt-2 font-semibold text-signal-stop" : "mt-2"}
        >
          {state.text}
        </p>
      )}
    </div>
  );
}
