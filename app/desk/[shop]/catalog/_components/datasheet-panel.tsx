"use client";
import { useRouter } from "next/navigation";
import { useRef, useState, useTransition } from "react";
import { Button } from "@/components/ui/button";
import { api, apiErrorMessage, asFormData } from "@/lib/api/client";
import { FormMessage } from "@/components/ui/field";
import { MAX_ATTACHMENT_SIZE_TEXT } from "@/lib/validation/limits";

/**
 * A cell's datasheet: a PDF (checked by its content on the server), stored privately and linked
 * from the options and quotes that use the cell. Upload replaces the one there was.
 */
export function DatasheetPanel({
  shop,
  sku,
  canWrite,
  current,
}: {
  shop: string;
  sku: string;
  canWrite: boolean;
  current: { fileName: string; sizeBytes: number; uploadedOn: string } | null;
}) {
  const router = useRouter();
  const input = useRef<HTMLInputElement>(null);
  const [message, setMessage] = useState<{ tone: "error" | "info"; text: string } | null>(null);
  const [busy, start] = useTransition();
  const href = `/api/v1/shops/${shop}/cells/${encodeURIComponent(sku)}/datasheet`;

  const upload = () =>
    start(async () => {
      setMessage(null);
      const file = input.current?.files?.[0];
      if (!file) {
        setMessage({ tone: "error", text: "Choose a PDF first." });
        return;
      }
      const sent = await api
        .POST("/api/v1/shops/{shop}/cells/{sku}/datasheet", { params: { path: { shop, sku } }, body: { file }, bodySerializer: asFormData })
        .catch(() => null);
      if (sent?.data) {
        setMessage({ tone: "info", text: `${sent.data.fileName} is the datasheet now.` });
        if (input.current) input.current.value = "";
        router.refresh();
      } else {
        setMessage({ tone: "error", text: sent ? apiErrorMessage(sent.error, sent.response) : "The upload failed; check your connection and try again." });
      }
    });

  const remove = () =>
    start(async () => {
      const sent = await api.DELETE("/api/v1/shops/{shop}/cells/{sku}/datasheet", { params: { path: { shop, sku } } }).catch(() => null);
      setMessage(
        sent?.response.ok
          ? { tone: "info", text: "Datasheet removed." }
          : { tone: "error", text: sent ? `Not removed: ${apiErrorMessage(sent.error, sent.response)}` : "Not removed; check your connection and try again." },
      );
      router.refresh();
    });

  return (
    <section className="space-y-3 rounded-lg bg-white p-4 ring-1 ring-ink-100" aria-labelledby="datasheet-title">
      <h2 id="datasheet-title" className="text-sm font-semibold text-ink-800">
        Datasheet
      </h2>
      {current ? (
        <p className="text-sm">
          <a href={href} className="font-medium text-copper-600 hover:underline">
            {current.fileName}
          </a>{" "}
          <span className="text-ink-500">
            · {Math.max(1, Math.round(current.sizeBytes / 1024))} kB · {current.uploadedOn}
          </span>
        </p>
      ) : (
        <p className="text-sm text-ink-600">None yet. Customers see a datasheet link beside every option and quote built from this cell once there is one.</p>
      )}
      {canWrite ? (
        <div className="space-y-2">
          <label htmlFor="datasheet-file" className="block text-sm font-medium text-ink-800">
            {current ? "Replace with" : "Upload"} a PDF
          </label>
          <input
            id="datasheet-file"
            ref={input}
            type="file"
            accept="application/pdf,.pdf"
            aria-describedby="datasheet-hint"
            className="block w-full text-sm file:mr-3 file:rounded-md file:border-0 file:bg-ink-100 file:px-3 file:py-1.5"
          />
          <p id="datasheet-hint" className="text-xs text-ink-500">
            A PDF of at most {MAX_ATTACHMENT_SIZE_TEXT}; judged by its content, not its name.
          </p>
          <div className="flex gap-3">
            <Button type="button" variant="secondary" onClick={upload} disabled={busy}>
              {busy ? "Working…" : "Upload datasheet"}
            </Button>
            {current ? (
              <Button type="button" variant="quiet" onClick={remove} disabled={busy}>
                Remove
              </Button>
            ) : null}
          </div>
        </div>
      ) : null}
      {message ? <FormMessage tone={message.tone}>{message.text}</FormMessage> : null}
    </section>
  );
}
