"use client";

import { useRouter } from "next/navigation";
import { useEffect, useState } from "react";
import { apiJson } from "@/components/runs/put-with-progress";
import { csvFieldSpec, csvFields, unitLabels, type ColumnMap, type CsvField } from "@/lib/parsers/column-map";

interface Preview {
  format: string | null;
  error?: string;
  csv: null | {
    delimiter: string;
    decimal: "." | ",";
    headers: string[];
    rows: string[][];
    detected: { map: ColumnMap; confidence: Record<string, number>; unplaced: string[]; problems: string[] };
  };
}

export interface ColumnMapEditorProps {
  runId: number;
  crewId: number;
  current: Record<string, unknown> | null;
}

const delimiterName: Record<string, string> = { ",": "comma", ";": "semicolon", "\t": "tab", "|": "pipe" };

/** Shows each CSV column with its first values and lets the user say what it carries, then re-parses. */
export function ColumnMapEditor({ runId, crewId, current }: ColumnMapEditorProps) {
  const router = useRouter();
  const [preview, setPreview] = useState<Preview | null>(null);
  const [columns, setColumns] = useState<ColumnMap["columns"]>([]);
  const [saveName, setSaveName] = useState("");
  const [message, setMessage] = useState<{ tone: "ok" | "error"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  useEffect(() => {
    apiJson<Preview>(`/api/runs/${runId}/preview`)
      .then((p) => {
        setPreview(p);
        const used = (current as ColumnMap | null)?.columns;
        const base = p.csv?.detected.map.columns ?? [];
        setColumns(p.csv ? p.csv.headers.map((h) => used?.find((c) => c.header === h) ?? base.find((c) => c.header === h) ?? { header: h, field: "ignore" }) : []);
      })
      .catch((e) => setMessage({ tone: "error", text: (e as Error).message }));
  }, [runId, current]);

  if (!preview) return <p className="mt-3 text-sm text-ink-soft">{message?.text ?? "Reading the first rows…"}</p>;
  if (!preview.csv) return <p className="mt-3 text-sm text-ink-soft">{preview.error ?? "Only CSV logs have a column map."}</p>;
  const csv = preview.csv;

  const setColumn = (i: number, patch: Partial<ColumnMap["columns"][number]>) =>
    setColumns((cur) => cur.map((c, j) => (j === i ? { ...c, ...patch } : c)));

  async function submit() {
    setBusy(true);
    setMessage(null);
    const map: ColumnMap = { delimiter: csv.delimiter, decimal: csv.decimal, columns };
    try {
      if (saveName.trim()) await apiJson("/api/column-maps", { method: "POST", body: { crewId, name: saveName.trim(), mapping: map } });
      await apiJson(`/api/runs/${runId}/reparse`, { method: "POST", body: { columnMap: map } });
      setMessage({ tone: "ok", text: saveName.trim() ? `Saved as “${saveName.trim()}”; re-parsing…` : "Re-parsing with this map…" });
      router.refresh();
    } catch (e) {
      setMessage({ tone: "error", text: (e as Error).message });
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="mt-4">
      <p className="text-sm text-ink-soft">
        Columns separated by {delimiterName[csv.delimiter] ?? `“${csv.delimiter}”`}, decimals written with “{csv.decimal}”.
      </p>
      {csv.detected.problems.length > 0 && (
        <ul className="mt-2 list-disc pl-5 text-sm text-watch">
          {csv.detected.problems.map((p) => (
            <li key={p}>{p}</li>
          ))}
        </ul>
      )}
      <div className="mt-3 divide-y divide-rule rounded-md border border-rule">
        {columns.map((c, i) => {
          const spec = csvFieldSpec(c.field as CsvField);
          const detectedField = csv.detected.map.columns.find((d) => d.header === c.header)?.field ?? "ignore";
          const conf = detectedField === c.field ? csv.detected.confidence[c.header] : undefined;
          const values = csv.rows.slice(0, 3).map((r) => r[i] ?? "");
          return (
            <div key={c.header + i} className="grid gap-2 p-3 sm:grid-cols-[minmax(0,1.2fr)_minmax(0,1.4fr)_minmax(0,1fr)_minmax(0,1fr)] sm:items-center">
              <div className="min-w-0">
                <p className="truncate font-medium" title={c.header}>
                  {c.header}
                </p>
                <p className="figures truncate text-xs text-ink-soft">{values.join(" · ") || "(empty)"}</p>
              </div>
              <label className="sr-only" htmlFor={`field-${i}`}>
                What column {c.header} carries
              </label>
              <select
                id={`field-${i}`}
                className="field-input"
                value={c.field}
                onChange={(e) => {
                  const field = e.target.value as CsvField;
                  setColumn(i, { field, unit: csvFieldSpec(field).units[0] });
                }}
              >
                {csvFields.map((f) => (
                  <option key={f.field} value={f.field}>
                    {f.label}
                  </option>
                ))}
              </select>
              {spec.units.length > 1 ? (
                <>
                  <label className="sr-only" htmlFor={`unit-${i}`}>
                    Unit of column {c.header}
                  </label>
                  <select id={`unit-${i}`} className="field-input" value={c.unit ?? spec.units[0]} onChange={(e) => setColumn(i, { unit: e.target.value })}>
                    {spec.units.map((u) => (
                      <option key={u} value={u}>
                        {unitLabels[u] ?? u}
                      </option>
                    ))}
                  </select>
                </>
              ) : (
                <span className="text-sm text-ink-soft">{spec.units[0] ? unitLabels[spec.units[0]] : ""}</span>
              )}
              <span className="text-sm text-ink-soft">{conf === undefined ? "set by hand" : conf >= 0.8 ? "sure" : conf >= 0.5 ? "likely — check" : "guess — check"}</span>
            </div>
          );
        })}
      </div>
      <div className="mt-4 flex flex-wrap items-end gap-3">
        <div>
          <label htmlFor="save-name" className="field-label">
            Save for the crew as (optional)
          </label>
          <input id="save-name" className="field-input" value={saveName} onChange={(e) => setSaveName(e.target.value)} placeholder="e.g. rover telemetry v2" />
        </div>
        <button type="button" className="btn-primary" disabled={busy} onClick={submit}>
          {busy ? "Starting…" : "Re-parse with this map"}
        </button>
      </div>
      <div aria-live="polite" className="mt-2 min-h-5">
        {message && <p className={message.tone === "ok" ? "text-sm text-clear" : "text-sm text-act"}>{message.text}</p>}
      </div>
    </div>
  );
}
