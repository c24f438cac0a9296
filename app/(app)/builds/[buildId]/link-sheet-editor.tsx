"use client";

import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { ApiFailure, parseNumber, reanalysingWords, sendJson } from "@/components/builds/api";
import type { ChannelFunction, FailsafeAction } from "@/db/schema/builds";

export interface EditorChannel {
  channel: number;
  function: ChannelFunction;
  switchLabel: string | null;
  positions: number | null;
  engageMinUs: number | null;
  engageMaxUs: number | null;
  failsafeUs: number | null;
}

// Labels for db/schema/builds.ts channelFunctions (kept here: the schema module is server-side).
const functionLabels: Record<ChannelFunction, string> = {
  roll: "Roll",
  pitch: "Pitch",
  throttle: "Throttle",
  yaw: "Yaw",
  arm: "Arm",
  "return-to-home": "Return to home",
  mission: "Mission",
  mode: "Mode",
  rssi: "RSSI",
  aux: "Aux",
  unused: "Unused",
};

const channelFunctions = Object.keys(functionLabels) as ChannelFunction[];

interface Row {
  channel: number;
  function: ChannelFunction;
  switchLabel: string;
  positions: string;
  engageMinUs: string;
  engageMaxUs: string;
  failsafeUs: string;
}

const text = (v: number | null) => (v == null ? "" : String(v));
const toRow = (c: EditorChannel): Row => ({
  channel: c.channel,
  function: c.function,
  switchLabel: c.switchLabel ?? "",
  positions: text(c.positions),
  engageMinUs: text(c.engageMinUs),
  engageMaxUs: text(c.engageMaxUs),
  failsafeUs: text(c.failsafeUs),
});

type NumField = "engageMinUs" | "engageMaxUs" | "failsafeUs";
const numFields: NumField[] = ["engageMinUs", "engageMaxUs", "failsafeUs"];

/**
 * The link sheet as 18 rows (a table on wide screens, one card per channel on a phone) with the
 * failsafe plan beside it; saved together as one history entry. Native inputs throughout, so the
 * keyboard works everywhere.
 */
export function LinkSheetEditor({
  buildId,
  channels,
  failsafeAction,
  failsafeWithinS,
}: {
  buildId: number;
  channels: EditorChannel[];
  failsafeAction: FailsafeAction | null;
  failsafeWithinS: number | null;
}) {
  const router = useRouter();
  const initial = useMemo(() => {
    const byChannel = new Map(channels.map((c) => [c.channel, c]));
    return Array.from({ length: 18 }, (_, i) =>
      toRow(byChannel.get(i + 1) ?? { channel: i + 1, function: "unused", switchLabel: null, positions: null, engageMinUs: null, engageMaxUs: null, failsafeUs: null }),
    );
  }, [channels]);
  const [rows, setRows] = useState<Row[]>(initial);
  const [action, setAction] = useState<string>(failsafeAction ?? "");
  const [within, setWithin] = useState<string>(text(failsafeWithinS));
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  const [base, setBase] = useState({ rows: initial, action: failsafeAction ?? "", within: text(failsafeWithinS) });
  const dirty = JSON.stringify({ rows, action, within }) !== JSON.stringify(base);
  // On a phone the 18 cards are long: channels unused when last saved fold away until asked for.
  const [showUnused, setShowUnused] = useState(false);
  const folded = (i: number) => !showUnused && base.rows[i].function === "unused" && rows[i].function === "unused";
  const foldedCount = rows.filter((_, i) => folded(i)).length;

  const set = (i: number, patch: Partial<Row>) => setRows((rs) => rs.map((r, k) => (k === i ? { ...r, ...patch } : r)));

  async function save() {
    setMessage(null);
    const local: Record<string, string[]> = {};
    const channelsOut = rows.map((r, i) => {
      const nums = Object.fromEntries(
        numFields.map((f) => {
          const v = parseNumber(r[f]);
          if (Number.isNaN(v) || (v != null && !Number.isInteger(v))) local[`channels.${i}.${f}`] = ["Whole microseconds, e.g. 1500"];
          return [f, Number.isNaN(v) ? null : v];
        }),
      );
      return {
        channel: r.channel,
        function: r.function,
        switchLabel: r.switchLabel.trim() || null,
        positions: r.positions ? Number(r.positions) : null,
        ...nums,
      };
    });
    const withinS = parseNumber(within);
    if (Number.isNaN(withinS)) local.failsafeWithinS = ["Seconds, e.g. 1.5"];
    if (Object.keys(local).length) {
      setErrors(local);
      setMessage({ ok: false, text: "Some values need attention" });
      return;
    }
    setBusy(true);
    try {
      const res = await sendJson<{ changed: string[]; reanalysing: number; check: { findings: unknown[] } }>(`/api/builds/${buildId}/link-sheet`, "PUT", {
        channels: channelsOut,
        failsafeAction: action || null,
        failsafeWithinS: withinS,
      });
      setErrors({});
      setBase({ rows, action, within });
      const n = res.changed.length;
      setMessage({
        ok: true,
        text:
          n === 0
            ? "Nothing had changed."
            : `Saved ${n} change${n === 1 ? "" : "s"}. The sheet check now lists ${res.check.findings.length} finding${res.check.findings.length === 1 ? "" : "s"}.${reanalysingWords(res.reanalysing)}`,
      });
      router.refresh();
    } catch (e) {
      const f = e instanceof ApiFailure ? e.fields : {};
      setErrors(f);
      setMessage({ ok: false, text: (e as Error).message });
    } finally {
      setBusy(false);
    }
  }

  const err = (key: string) => errors[key]?.join(" ");
  const inputCls = "field-input min-h-10 px-2 py-1.5";
  const labelCls = "mb-0.5 block text-xs font-medium text-ink-soft md:sr-only";

  return (
    <form
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        void save();
      }}
      className="grid gap-6 xl:grid-cols-[minmax(0,1fr)_15rem]"
      data-testid="link-sheet-editor"
    >
      <div className="min-w-0">
        <div
          aria-hidden="true"
          className="hidden gap-2 border-b border-rule pb-1 text-xs font-semibold text-ink-soft md:grid md:grid-cols-[2.5rem_9.5rem_minmax(4rem,1fr)_4.5rem_5rem_5rem_5rem]"
        >
          <span>Ch</span>
          <span>Function</span>
          <span>Switch</span>
          <span>Positions</span>
          <span>Engages from µs</span>
          <span>Engages to µs</span>
          <span>On link loss µs</span>
        </div>
        <div className="grid gap-3 md:gap-1">
          {rows.map((r, i) => {
            const id = (f: string) => `ls-${r.channel}-${f}`;
            const rowErr = ["function", "switchLabel", "positions", ...numFields].map((f) => err(`channels.${i}.${f}`)).filter(Boolean);
            return (
              <div
                key={r.channel}
                role="group"
                aria-labelledby={`ls-${r.channel}-name`}
                data-channel={r.channel}
                className={`${folded(i) ? "hidden md:grid" : "grid"} grid-cols-6 gap-2 rounded-md border border-rule p-3 md:grid-cols-[2.5rem_9.5rem_minmax(4rem,1fr)_4.5rem_5rem_5rem_5rem] md:items-center md:rounded-none md:border-0 md:border-b md:p-0 md:py-1 ${r.function === "unused" ? "md:opacity-80" : ""}`}
              >
                <p id={`ls-${r.channel}-name`} className="col-span-6 font-semibold md:col-span-1 md:text-center">
                  <span className="md:sr-only">Channel </span>
                  <span className="figures">{r.channel}</span>
                </p>
                <div className="col-span-6 sm:col-span-3 md:col-span-1">
                  <label htmlFor={id("function")} className={labelCls}>
                    Function
                  </label>
                  <select id={id("function")} className={inputCls} value={r.function} onChange={(e) => set(i, { function: e.target.value as ChannelFunction })}>
                    {channelFunctions.map((f) => (
                      <option key={f} value={f}>
                        {functionLabels[f]}
                      </option>
                    ))}
                  </select>
                </div>
                <div className="col-span-4 sm:col-span-2 md:col-span-1">
                  <label htmlFor={id("switch")} className={labelCls}>
                    Switch
                  </label>
                  <input id={id("switch")} className={inputCls} value={r.switchLabel} maxLength={40} placeholder="—" onChange={(e) => set(i, { switchLabel: e.target.value })} />
                </div>
                <div className="col-span-2 sm:col-span-1 md:col-span-1">
                  <label htmlFor={id("positions")} className={labelCls}>
                    Positions
                  </label>
                  <select id={id("positions")} className={inputCls} value={r.positions} onChange={(e) => set(i, { positions: e.target.value })}>
                    <option value="">—</option>
                    {[2, 3, 4, 5, 6].map((n) => (
                      <option key={n} value={n}>
                        {n}
                      </option>
                    ))}
                  </select>
                </div>
                {(
                  [
                    ["engageMinUs", "Engages from (µs)"],
                    ["engageMaxUs", "Engages to (µs)"],
                    ["failsafeUs", "On link loss (µs)"],
                  ] as const
                ).map(([f, label]) => (
                  <div key={f} className="col-span-2 md:col-span-1">
                    <label htmlFor={id(f)} className={`${labelCls} min-h-8 md:min-h-0`}>
                      {label}
                    </label>
                    <input
                      id={id(f)}
                      className={`${inputCls} figures`}
                      inputMode="numeric"
                      value={r[f]}
                      placeholder="—"
                      aria-invalid={err(`channels.${i}.${f}`) ? true : undefined}
                      onChange={(e) => set(i, { [f]: e.target.value } as Partial<Row>)}
                    />
                  </div>
                ))}
                {rowErr.length > 0 && (
                  <p className="field-error col-span-full" aria-live="polite">
                    Channel {r.channel}: {rowErr.join(" ")}
                  </p>
                )}
              </div>
            );
          })}
        </div>
        {(foldedCount > 0 || showUnused) && (
          <button type="button" className="btn-quiet mt-3 w-full md:hidden" aria-expanded={showUnused} onClick={() => setShowUnused((v) => !v)}>
            {showUnused ? "Fold the unused channels away" : `Show the ${foldedCount} unused channel${foldedCount === 1 ? "" : "s"}`}
          </button>
        )}
        {err("channels") && <p className="field-error">{err("channels")}</p>}
        <p className="mt-3 text-sm text-ink-soft">
          Switch positions are expected near 1000, 1500 and 2000 µs (± 100 µs; common practice). Give channels driven by one switch the same switch name.
          For a mode channel, record the range of the mode the failsafe plan uses.
        </p>
      </div>

      <aside className="h-fit rounded-md border border-rule bg-paper p-4" aria-labelledby="fs-plan">
        <h3 id="fs-plan" className="font-semibold">
          Failsafe plan
        </h3>
        <p className="mt-1 text-sm text-ink-soft">What the vehicle should do when the link is lost, and how soon. Saved with the sheet.</p>
        <div className="mt-3 grid gap-3">
          <div>
            <label htmlFor="fs-action" className="field-label">
              Expected action
            </label>
            <select id="fs-action" className="field-input" value={action} onChange={(e) => setAction(e.target.value)}>
              <option value="">Not set</option>
              <option value="return-to-home">Return to home</option>
              <option value="hold">Hold position</option>
              <option value="land">Land</option>
            </select>
            {err("failsafeAction") && <p className="field-error">{err("failsafeAction")}</p>}
          </div>
          <div>
            <label htmlFor="fs-within" className="field-label">
              Acts within (s)
            </label>
            <input
              id="fs-within"
              className="field-input figures"
              inputMode="decimal"
              value={within}
              placeholder="e.g. 1.5"
              aria-invalid={err("failsafeWithinS") ? true : undefined}
              aria-describedby={err("failsafeWithinS") ? "fs-within-error" : undefined}
              onChange={(e) => setWithin(e.target.value)}
            />
            {err("failsafeWithinS") && (
              <p id="fs-within-error" className="field-error">
                {err("failsafeWithinS")}
              </p>
            )}
          </div>
        </div>
      </aside>

      <div className="flex flex-wrap items-center gap-3 xl:col-span-2">
        <button type="submit" className="btn-primary" disabled={busy}>
          {busy ? "Saving…" : "Save link sheet"}
        </button>
        {dirty && !busy && <span className="text-sm text-watch">Unsaved changes</span>}
        <div role="status" aria-live="polite" className="min-h-5 text-sm" data-testid="link-sheet-status">
          {message && <span className={message.ok ? "text-clear" : "text-act"}>{message.text}</span>}
        </div>
      </div>
    </form>
  );
}
