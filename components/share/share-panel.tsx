"use client";

import { useId, useRef, useState } from "react";
import useSWR from "swr";
import { apiJson } from "@/components/runs/put-with-progress";
import { SHARE_EXPIRY_CHOICES } from "@/lib/validations/share";

/** A link as `GET /api/runs/{id}/share-links` lists it (dates as ISO strings). */
interface ListedLink {
  id: number;
  createdAt: string;
  createdBy: string | null;
  expiresAt: string;
  revokedAt: string | null;
  viewCount: number;
  lastViewedAt: string | null;
  state: "active" | "expired" | "revoked";
}

const utc = (iso: string | null) => (iso ? new Date(iso).toISOString().replace("T", " ").slice(0, 16) + " UTC" : "—");
const stateWords: Record<ListedLink["state"], string> = { active: "Active", expired: "Expired", revoked: "Revoked" };
const dayWords = (d: number) => (d === 1 ? "1 day" : `${d} days`);

/**
 * For a run's leads: make a read-only link to this debrief for people without an account, copy it
 * (it is shown only once: the server keeps a hash), see how often each link was opened, withdraw it.
 */
export function SharePanel({ runId }: { runId: number }) {
  const listUrl = `/api/runs/${runId}/share-links`;
  const { data, error, mutate } = useSWR<{ shareLinks: ListedLink[] }, Error>(listUrl, (u: string) => apiJson(u), { revalidateOnFocus: false });
  const [days, setDays] = useState<number>(7);
  const [fresh, setFresh] = useState<{ url: string; expiresAt: string } | null>(null);
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const [copied, setCopied] = useState(false);
  const urlRef = useRef<HTMLInputElement>(null);
  const selectId = useId();

  const create = async () => {
    setBusy(true);
    setMessage(null);
    setCopied(false);
    try {
      const made = await apiJson<{ id: number; url: string; expiresAt: string }>(listUrl, { method: "POST", body: { expiresInDays: days } });
      setFresh({ url: made.url, expiresAt: made.expiresAt });
      await mutate();
    } catch (e) {
      setMessage((e as Error).message);
    } finally {
      setBusy(false);
    }
  };

  const copy = async () => {
    if (!fresh) return;
    try {
      await navigator.clipboard.writeText(fresh.url);
      setCopied(true);
    } catch {
      // No clipboard permission (or not a secure context): select the text for a manual copy.
      urlRef.current?.select();
    }
  };

  const revoke = async (id: number) => {
    if (!window.confirm("Revoke this link? Anyone holding it loses access at once.")) return;
    setMessage(null);
    try {
      await apiJson(`/api/share-links/${id}`, { method: "DELETE" });
      await mutate();
    } catch (e) {
      setMessage((e as Error).message);
    }
  };

  const links = data?.shareLinks ?? [];

  return (
    <section className="panel mt-6" aria-labelledby={`${selectId}-title`} data-testid="share-panel">
      <h2 id={`${selectId}-title`} className="text-lg font-semibold">
        Share this debrief
      </h2>
      <p className="mt-1 max-w-prose text-sm text-ink-soft">
        A read-only link for someone without an account — an instructor, a client, an event marshal. It shows this debrief only
        (charts, map, events, notes and sign-off), never the rest of the crew, and stops working when it expires or you revoke it.
      </p>
      <div className="mt-3 flex flex-wrap items-end gap-2">
        <div>
          <label htmlFor={selectId} className="field-label">
            Valid for
          </label>
          <select id={selectId} className="field-input" value={days} onChange={(e) => setDays(Number(e.target.value))}>
            {SHARE_EXPIRY_CHOICES.map((d) => (
              <option key={d} value={d}>
                {dayWords(d)}
              </option>
            ))}
          </select>
        </div>
        <button type="button" className="btn-primary" onClick={create} disabled={busy}>
          {busy ? "Making the link…" : "Make a share link"}
        </button>
      </div>

      {fresh && (
        <div className="mt-3 rounded-md border border-tide-300 bg-tide-50 p-3" data-testid="share-new-link">
          <label htmlFor={`${selectId}-url`} className="field-label">
            The new link (valid until {utc(fresh.expiresAt)})
          </label>
          <div className="flex flex-wrap gap-2">
            <input id={`${selectId}-url`} ref={urlRef} className="field-input figures min-w-0 flex-1" readOnly value={fresh.url} onFocus={(e) => e.currentTarget.select()} />
            <button type="button" className="btn-quiet" onClick={copy}>
              {copied ? "Copied" : "Copy"}
            </button>
          </div>
          <p className="mt-1 text-xs text-ink-soft">Copy it now: Sortie keeps only a fingerprint of it and cannot show it again.</p>
        </div>
      )}

      <div aria-live="polite" role="status" className="min-h-5">
        {(message || error) && <p className="mt-2 rounded-md bg-act/10 px-3 py-2 text-sm text-act">{message ?? error?.message}</p>}
      </div>

      {links.length > 0 && (
        <div className="mt-3 overflow-x-auto">
          <table className="w-full text-left text-sm" data-testid="share-links">
            <thead className="text-ink-soft">
              <tr>
                <th scope="col" className="py-1 pr-3 font-medium">Made</th>
                <th scope="col" className="py-1 pr-3 font-medium">Expires</th>
                <th scope="col" className="py-1 pr-3 font-medium">Views</th>
                <th scope="col" className="py-1 pr-3 font-medium">Last view</th>
                <th scope="col" className="py-1 pr-3 font-medium">State</th>
                <th scope="col" className="py-1 font-medium">
                  <span className="sr-only">Actions</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {links.map((l) => (
                <tr key={l.id} className="border-t border-rule" data-share-link-id={l.id}>
                  <td className="figures py-2 pr-3">
                    {utc(l.createdAt)}
                    {l.createdBy ? <span className="block text-xs text-ink-soft">by {l.createdBy}</span> : null}
                  </td>
                  <td className="figures py-2 pr-3">{utc(l.expiresAt)}</td>
                  <td className="figures py-2 pr-3">{l.viewCount.toLocaleString("en")}</td>
                  <td className="figures py-2 pr-3">{utc(l.lastViewedAt)}</td>
                  <td className="py-2 pr-3">
                    {stateWords[l.state]}
                    {l.state === "revoked" ? <span className="figures block text-xs text-ink-soft">{utc(l.revokedAt)}</span> : null}
                  </td>
                  <td className="py-2 text-right">
                    {l.state === "active" ? (
                      <button type="button" className="btn-danger" onClick={() => revoke(l.id)}>
                        Revoke
                      </button>
                    ) : null}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
