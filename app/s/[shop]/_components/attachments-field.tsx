"use client";
import Link from "next/link";
import { useEffect, useId, useRef, useState } from "react";
import { api, apiErrorMessage, asFormData } from "@/lib/api/client";
import { MAX_ATTACHMENT_SIZE_TEXT, MAX_ATTACHMENTS_PER_REQUEST } from "@/lib/validation/limits";
import type { UploadedFile } from "./saved-request";
import type { Viewer } from "./viewer";

function size(bytes: number): string {
  if (bytes >= 1024 * 1024) return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
  if (bytes >= 1024) return `${Math.round(bytes / 1024)} kB`;
  return `${bytes} B`;
}

/** Drawings and specifications for signed-in customers, uploaded as they are picked. */
export function AttachmentsField({
  slug,
  viewer,
  files,
  onChange,
}: {
  slug: string;
  viewer: Viewer;
  files: UploadedFile[];
  onChange: (next: UploadedFile[]) => void;
}) {
  const id = useId();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const input = useRef<HTMLInputElement>(null);

  async function upload(list: FileList | null) {
    if (!list || list.length === 0) return;
    setError(null);
    setBusy(true);
    const added: UploadedFile[] = [];
    try {
      for (const file of Array.from(list)) {
        if (files.length + added.length >= MAX_ATTACHMENTS_PER_REQUEST) {
          setError(`At most ${MAX_ATTACHMENTS_PER_REQUEST} files per request.`);
          break;
        }
        const { data, error, response } = await api.POST("/api/v1/shops/{shop}/attachments", {
          params: { path: { shop: slug } },
          body: { file },
          bodySerializer: asFormData,
        });
        if (data) added.push({ id: data.id, fileName: data.fileName, sizeBytes: data.sizeBytes });
        else setError(`${file.name}: ${apiErrorMessage(error, response)}`);
      }
    } catch {
      setError("The upload failed; check your connection and try again.");
    } finally {
      setBusy(false);
      if (added.length > 0) onChange([...files, ...added]);
    }
  }

  // a file picked before the page's script took over the field is uploaded now, not lost
  useEffect(() => {
    const el = input.current;
    if (el?.files && el.files.length > 0) {
      void upload(el.files);
      el.value = "";
    }
    // once, when the field comes alive
  }, []);

  if (viewer.kind !== "customer") {
    return (
      <div className="space-y-1">
        <p className="text-sm font-medium text-ink-800">Drawings and specifications</p>
        <p className="text-sm text-ink-600">
          {viewer.kind === "staff" ? (
            "Attachments are for customers' requests."
          ) : (
            <>
              <Link className="font-medium text-copper-700 hover:underline" href={`/sign-in?shop=${slug}&next=${encodeURIComponent(`/s/${slug}`)}`}>
                Sign in
              </Link>{" "}
              to attach drawings (PDF, PNG, JPEG or DXF, up to {MAX_ATTACHMENT_SIZE_TEXT} each). What you typed here is kept.
            </>
          )}
        </p>
      </div>
    );
  }

  return (
    <div className="space-y-2">
      <label htmlFor={id} className="block text-sm font-medium text-ink-800">
        Drawings and specifications (optional)
      </label>
      <input
        ref={input}
        id={id}
        type="file"
        multiple
        accept=".pdf,.png,.jpg,.jpeg,.dxf,application/pdf,image/png,image/jpeg"
        disabled={busy}
        aria-describedby={`${id}-hint`}
        className="block w-full text-sm text-ink-700 file:mr-3 file:rounded-md file:border-0 file:bg-ink-100 file:px-3 file:py-2 file:text-sm file:font-medium"
        onChange={(e) => {
          void upload(e.target.files);
          e.target.value = "";
        }}
      />
      <p id={`${id}-hint`} className="text-xs text-ink-500">
        PDF, PNG, JPEG or DXF, up to {MAX_ATTACHMENT_SIZE_TEXT} each; checked by content. Only you and the shop&apos;s staff can open them.
      </p>
      {busy ? <p className="text-xs text-ink-600">Uploading…</p> : null}
      {error ? (
        <p role="alert" className="text-xs font-medium text-danger-700">
          {error}
        </p>
      ) : null}
      {files.length > 0 ? (
        <ul className="divide-y divide-ink-100 rounded-md ring-1 ring-ink-100" aria-label="Attached files">
          {files.map((f) => (
            <li key={f.id} className="flex items-center justify-between gap-2 px-3 py-1.5 text-sm">
              <span className="truncate">{f.fileName}</span>
              <span className="flex shrink-0 items-center gap-3 text-xs text-ink-500">
                {size(f.sizeBytes)}
                <button
                  type="button"
                  className="text-danger-700 hover:underline"
                  onClick={() => onChange(files.filter((x) => x.id !== f.id))}
                  aria-label={`Remove ${f.fileName}`}
                >
                  Remove
                </button>
              </span>
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
