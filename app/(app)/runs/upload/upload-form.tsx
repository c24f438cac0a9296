"use client";

import Link from "next/link";
import { useState } from "react";
import { formatBytes } from "@/components/runs/format-bytes";
import { ProgressBar } from "@/components/runs/progress-bar";
import { partOf, partStart, severalRunsSentence, type UploadRunLink } from "@/components/runs/run-parts";
import { VerdictBadge } from "@/components/runs/verdict-badge";
import { formatSpan } from "@/lib/format/units";
import { uploadOne, type UploadPhase } from "@/components/runs/upload-one";

export interface UploadFormProps {
  crewId: number;
  maxBytes: number;
  builds: { id: number; name: string }[];
  routePlans: { id: number; name: string }[];
  columnMaps: { id: number; name: string }[];
}

interface Item {
  file: File;
  state: UploadPhase;
}

const optionalId = (v: FormDataEntryValue | null) => (v ? Number(v) : undefined);

export function UploadForm({ crewId, maxBytes, builds, routePlans, columnMaps }: UploadFormProps) {
  const [items, setItems] = useState<Item[]>([]);
  const [busy, setBusy] = useState(false);

  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = new FormData(e.currentTarget);
    const files = (form.getAll("files") as File[]).filter((f) => f.size > 0 || f.name);
    if (files.length === 0) return;
    const list: Item[] = files.map((file) => ({
      file,
      state: file.size > maxBytes ? { phase: "error", message: `${formatBytes(file.size)} is over the ${formatBytes(maxBytes)} limit` } : { phase: "waiting" },
    }));
    setItems(list);
    setBusy(true);
    const opts = {
      crewId,
      buildId: optionalId(form.get("buildId")),
      routePlanId: optionalId(form.get("routePlanId")),
      columnMapId: optionalId(form.get("columnMapId")),
      note: String(form.get("note") ?? ""),
    };
    for (let i = 0; i < list.length; i++) {
      if (list[i].state.phase === "error") continue;
      await uploadOne(list[i].file, opts, (state) => setItems((cur) => cur.map((it, j) => (j === i ? { ...it, state } : it))));
    }
    setBusy(false);
  }

  return (
    <>
      <form onSubmit={onSubmit} className="panel grid gap-4 sm:grid-cols-2">
        <div className="sm:col-span-2">
          <label htmlFor="files" className="field-label">
            Log files
          </label>
          <input
            id="files"
            name="files"
            type="file"
            multiple
            required
            accept=".csv,.txt,.log,.tsv,.gpx,.nmea,.nma,text/csv,text/plain,application/gpx+xml"
            className="block w-full rounded-md border border-dashed border-tide-500 bg-tide-50 p-4 text-base file:mr-4 file:min-h-11 file:rounded-md file:border-0 file:bg-tide-700 file:px-4 file:font-semibold file:text-white"
            aria-describedby="files-hint"
          />
          <p id="files-hint" className="mt-1 text-sm text-ink-soft">
            CSV telemetry, GPX 1.0/1.1 or NMEA 0183 text, up to {formatBytes(maxBytes)} each. The original is kept so it can be re-parsed.
          </p>
        </div>
        <Select name="buildId" label="Build" empty="No build" options={builds} />
        <Select name="routePlanId" label="Route plan" empty="No route plan" options={routePlans} />
        <Select name="columnMapId" label="Column map (CSV)" empty="Detect the columns" options={columnMaps} />
        <div>
          <label htmlFor="note" className="field-label">
            Note
          </label>
          <input id="note" name="note" className="field-input" placeholder="e.g. gusty, new antenna" maxLength={5000} />
        </div>
        <div className="sm:col-span-2">
          <button type="submit" className="btn-primary" disabled={busy}>
            {busy ? "Uploading…" : "Upload"}
          </button>
        </div>
      </form>
      {items.length > 0 && (
        <ul className="mt-6 space-y-3" aria-live="polite">
          {items.map((it, i) => (
            <li key={i} className="panel">
              <p className="mb-2 font-medium">
                {it.file.name} <span className="figures text-sm text-ink-soft">{formatBytes(it.file.size)}</span>
              </p>
              <ItemState item={it} />
            </li>
          ))}
        </ul>
      )}
    </>
  );
}

function Select({ name, label, empty, options }: { name: string; label: string; empty: string; options: { id: number; name: string }[] }) {
  return (
    <div>
      <label htmlFor={name} className="field-label">
        {label}
      </label>
      <select id={name} name={name} className="field-input" defaultValue="">
        <option value="">{empty}</option>
        {options.map((o) => (
          <option key={o.id} value={o.id}>
            {o.name}
          </option>
        ))}
      </select>
    </div>
  );
}

function ItemState({ item }: { item: Item }) {
  const s = item.state;
  switch (s.phase) {
    case "waiting":
      return <p className="text-sm text-ink-soft">Waiting…</p>;
    case "sending":
      return <ProgressBar label="Sending to storage" value={item.file.size ? s.sent / item.file.size : 1} />;
    case "parsing":
      return <ProgressBar label="Reading the log" value={s.progress} tone="signal" />;
    case "error":
      return <p className="rounded-md bg-act/10 px-3 py-2 text-sm text-act">{s.message}</p>;
    case "done":
      if (s.status === "ready" && s.runs.length > 1) return <UploadRuns runs={s.runs} duplicate={s.duplicate} />;
      return (
        <div className="flex flex-wrap items-center justify-between gap-3">
          <p className={`flex flex-wrap items-center gap-2 ${s.status === "ready" ? "text-clear" : "text-act"}`}>
            {s.duplicate ? "Already uploaded: this is the same file as an earlier run." : s.status === "ready" ? "Ready." : `Could not be read: ${s.message}`}
            {s.status === "ready" && <VerdictBadge level={s.runs[0]?.verdict} />}
          </p>
          <Link href={`/runs/${s.runId}`} className="btn-quiet">
            Open the run
          </Link>
        </div>
      );
  }
}

/** A file that held several separate runs: one line per run, each with its verdict and its debrief. */
function UploadRuns({ runs, duplicate }: { runs: UploadRunLink[]; duplicate: boolean }) {
  return (
    <div>
      <p className="text-clear">
        {duplicate ? "Already uploaded: this is the same file as an earlier upload. " : "Ready. "}
        {severalRunsSentence(runs.length)}
      </p>
      <ul className="mt-2 divide-y divide-rule border-y border-rule" data-testid="upload-runs">
        {runs.map((r) => (
          <li key={r.id} className="flex flex-wrap items-center gap-x-3 gap-y-1 py-2">
            <span className="font-medium">{partOf(r.part, runs.length)}</span>
            <span className="figures text-sm text-ink-soft">
              {[partStart(r.startedAt) ?? "no clock in the log", formatSpan(r.durationS)].join(" · ")}
            </span>
            <VerdictBadge level={r.verdict} />
            <Link href={`/runs/${r.id}`} className="btn-quiet ml-auto" aria-label={`Open part ${r.part} of ${runs.length}`}>
              Open
            </Link>
          </li>
        ))}
      </ul>
    </div>
  );
}
