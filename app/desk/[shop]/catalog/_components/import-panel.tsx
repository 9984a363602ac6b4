"use client";
import { useRouter } from "next/navigation";
import { useMemo, useState, useTransition } from "react";
import { Button } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/field";
import { MAX_IMPORT_BYTES, type ImportPlan, type ImportRowStatus } from "@/lib/catalog/cell-csv";
import { importCells, previewCellImport } from "../actions";

const STATUS_LABELS: Record<ImportRowStatus, string> = { new: "New", changed: "Changed", unchanged: "Unchanged", error: "Error" };
const STATUS_TONE: Record<ImportRowStatus, string> = {
  new: "bg-charge-100 text-charge-700",
  changed: "bg-copper-100 text-copper-700",
  unchanged: "bg-ink-100 text-ink-600",
  error: "bg-danger-100 text-danger-700",
};

/**
 * Import a CSV of cells: read the file, show row by row what it would do (new, changed field by field
 * old → new, unchanged, or the error with row, column and reason), and apply it in one transaction
 * only when confirmed. Any error row blocks the import unless "apply only the valid rows" is chosen.
 */
export function ImportPanel({ shop }: { shop: string }) {
  const router = useRouter();
  const [csv, setCsv] = useState("");
  const [fileName, setFileName] = useState<string | null>(null);
  const [plan, setPlan] = useState<ImportPlan | null>(null);
  const [filter, setFilter] = useState<ImportRowStatus | "all">("all");
  const [applyValid, setApplyValid] = useState(false);
  const [message, setMessage] = useState<{ tone: "error" | "info"; text: string } | null>(null);
  const [busy, start] = useTransition();

  const rows = useMemo(() => (plan ? plan.rows.filter((r) => filter === "all" || r.status === filter) : []), [plan, filter]);
  const fileErrors = plan ? plan.errors.filter((e) => e.row === 1 && plan.rows.every((r) => r.row !== 1)) : [];
  const errorRows = plan ? plan.rows.filter((r) => r.status === "error").length : 0;
  const changes = plan ? plan.created + plan.updated : 0;
  const blocked = !plan || changes === 0 || fileErrors.length > 0 || (errorRows > 0 && !applyValid);

  const preview = (text: string) =>
    start(async () => {
      setMessage(null);
      setPlan(null);
      const r = await previewCellImport(shop, { csv: text, applyValid: false });
      if (!r.ok) setMessage({ tone: "error", text: r.fieldErrors?.csv?.[0] ?? r.message ?? "The file could not be read." });
      else {
        setPlan(r.data);
        setApplyValid(false);
        setFilter(r.data.errors.length > 0 ? "error" : "all");
      }
    });

  const apply = () =>
    start(async () => {
      const r = await importCells(shop, { csv, applyValid });
      if (!r.ok) {
        setMessage({ tone: "error", text: r.message ?? "Not imported." });
        return;
      }
      const { plan: done, applied } = r.data;
      setPlan(done);
      if (!applied) {
        setMessage({ tone: "error", text: "Nothing was imported: the catalog changed since the preview or rows have errors. Check the rows below." });
        return;
      }
      const skipped = done.rows.filter((x) => x.status === "error").length;
      setMessage({
        tone: "info",
        text: `Imported: ${done.created} new, ${done.updated} changed, ${done.unchanged} unchanged${skipped > 0 ? `, ${skipped} rows with errors skipped` : ""}.`,
      });
      setPlan(null);
      setCsv("");
      setFileName(null);
      router.refresh();
    });

  return (
    <section className="space-y-4 rounded-lg bg-white p-4 ring-1 ring-ink-100 sm:p-5" aria-labelledby="import-title">
      <h2 id="import-title" className="text-lg font-semibold">
        Import a CSV
      </h2>
      <div className="space-y-1">
        <label htmlFor="csv-file" className="block text-sm font-medium text-ink-800">
          CSV file
        </label>
        <input
          id="csv-file"
          type="file"
          accept=".csv,text/csv,text/plain"
          aria-describedby="csv-file-hint"
          className="block w-full text-sm file:mr-3 file:rounded-md file:border-0 file:bg-ink-100 file:px-3 file:py-1.5"
          onChange={async (e) => {
            const file = e.target.files?.[0];
            if (!file) return;
            if (file.size > MAX_IMPORT_BYTES) {
              setMessage({ tone: "error", text: `The file is larger than ${MAX_IMPORT_BYTES / 1024 / 1024} MB.` });
              return;
            }
            const text = await file.text();
            setCsv(text);
            setFileName(file.name);
            preview(text);
          }}
        />
        <p id="csv-file-hint" className="text-xs text-ink-500">
          Comma, semicolon or tab separated, with a header row; up to {MAX_IMPORT_BYTES / 1024 / 1024} MB. Nothing changes until you apply the preview.
        </p>
      </div>
      {busy ? (
        <p role="status" className="text-sm text-ink-600">
          Working…
        </p>
      ) : null}
      {message ? <FormMessage tone={message.tone}>{message.text}</FormMessage> : null}

      {plan ? (
        <div className="space-y-3" data-testid="import-preview">
          <p className="text-sm" role="status">
            {fileName ? <span className="font-medium">{fileName}: </span> : null}
            <span data-testid="import-counts">
              {plan.created} new, {plan.updated} changed, {plan.unchanged} unchanged, {errorRows + fileErrors.length} with errors
            </span>
          </p>
          {fileErrors.length > 0 ? (
            <ul className="list-disc space-y-1 pl-5 text-sm text-danger-700">
              {fileErrors.map((e) => (
                <li key={`${e.column}-${e.message}`}>
                  Row 1{e.column ? `, column ${e.column}` : ""}: {e.message}
                </li>
              ))}
            </ul>
          ) : null}
          <div className="flex flex-wrap items-end gap-3">
            <div>
              <label htmlFor="import-filter" className="block text-xs font-medium text-ink-700">
                Show
              </label>
              <select
                id="import-filter"
                value={filter}
                onChange={(e) => setFilter(e.target.value as ImportRowStatus | "all")}
                className="mt-1 rounded-md border border-ink-200 bg-white px-3 py-1.5 text-sm"
              >
                <option value="all">Every row</option>
                {(Object.keys(STATUS_LABELS) as ImportRowStatus[]).map((s) => (
                  <option key={s} value={s}>
                    {STATUS_LABELS[s]}
                  </option>
                ))}
              </select>
            </div>
          </div>
          <div className="max-h-[28rem] overflow-auto rounded-md ring-1 ring-ink-100">
            <table className="w-full text-sm">
              <caption className="sr-only">What the import would do, row by row</caption>
              <thead className="sticky top-0 bg-ink-50 text-ink-700">
                <tr>
                  <th scope="col" className="px-3 py-2 text-right font-medium">
                    Row
                  </th>
                  <th scope="col" className="px-3 py-2 text-left font-medium">
                    Part number
                  </th>
                  <th scope="col" className="px-3 py-2 text-left font-medium">
                    What happens
                  </th>
                  <th scope="col" className="px-3 py-2 text-left font-medium">
                    Details
                  </th>
                </tr>
              </thead>
              <tbody>
                {rows.map((r) => (
                  <tr key={r.row} className="border-t border-ink-100 align-top" data-status={r.status}>
                    <td className="num px-3 py-1.5 text-right">{r.row}</td>
                    <td className="whitespace-nowrap px-3 py-1.5 font-mono text-xs">{r.sku || "—"}</td>
                    <td className="px-3 py-1.5">
                      <span className={`rounded px-2 py-0.5 text-xs font-medium ${STATUS_TONE[r.status]}`}>{STATUS_LABELS[r.status]}</span>
                    </td>
                    <td className="px-3 py-1.5">
                      {r.status === "changed" ? (
                        <ul className="space-y-0.5">
                          {r.changes.map((c) => (
                            <li key={c.field}>
                              <span className="font-mono text-xs">{c.field}</span>: {c.from} → {c.to}
                            </li>
                          ))}
                        </ul>
                      ) : r.status === "error" ? (
                        <ul className="space-y-0.5 text-danger-700">
                          {r.errors.map((e) => (
                            <li key={`${e.column}-${e.message}`}>
                              {e.column ? <span className="font-mono text-xs">{e.column}</span> : "Row"}: {e.message}
                            </li>
                          ))}
                        </ul>
                      ) : r.status === "new" ? (
                        "Added to the catalog"
                      ) : (
                        "Same as the catalog"
                      )}
                    </td>
                  </tr>
                ))}
                {rows.length === 0 ? (
                  <tr>
                    <td colSpan={4} className="px-3 py-4 text-center text-ink-500">
                      No rows to show.
                    </td>
                  </tr>
                ) : null}
              </tbody>
            </table>
          </div>
          {errorRows > 0 && fileErrors.length === 0 ? (
            <div className="flex items-start gap-2 text-sm">
              <input id="apply-valid" type="checkbox" checked={applyValid} onChange={(e) => setApplyValid(e.target.checked)} className="mt-1" />
              <label htmlFor="apply-valid">
                Apply only the valid rows: skip the {errorRows} row{errorRows === 1 ? "" : "s"} with errors. Otherwise fix the file and choose it again; nothing
                is imported while a row has an error.
              </label>
            </div>
          ) : null}
          <Button type="button" onClick={apply} disabled={blocked || busy}>
            {changes === 0 ? "Nothing to apply" : `Apply ${changes} change${changes === 1 ? "" : "s"}`}
          </Button>
        </div>
      ) : null}
    </section>
  );
}
