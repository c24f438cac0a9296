/** JSON request to the app's API; failures carry the server's message and per-field problems. */
export class ApiFailure extends Error {
  constructor(
    message: string,
    readonly status: number,
    readonly fields: Record<string, string[]>,
  ) {
    super(message);
  }
}

export async function sendJson<T>(path: string, method: string, body?: unknown): Promise<T> {
  let res: Response;
  try {
    res = await fetch(path, {
      method,
      headers: body !== undefined ? { "content-type": "application/json" } : undefined,
      body: body !== undefined ? JSON.stringify(body) : undefined,
    });
  } catch {
    throw new ApiFailure("The connection dropped; check the signal and try again", 0, {});
  }
  const data = (await res.json().catch(() => ({}))) as { error?: { message?: string; details?: { fields?: Record<string, string[]> } } };
  if (!res.ok) throw new ApiFailure(data.error?.message ?? `Request failed (HTTP ${res.status})`, res.status, data.error?.details?.fields ?? {});
  return data as T;
}

/** "" → null, "1,5" → 1.5; anything else unreadable → NaN (the caller reports it). */
export function parseNumber(s: string): number | null {
  const t = s.trim().replace(",", ".");
  if (t === "") return null;
  return /^-?\d+(\.\d+)?$/.test(t) ? Number(t) : NaN;
}

/** After a save that re-analyses the build's runs: " 3 runs of this build are being analysed again." ("" for none). */
export function reanalysingWords(n: number | undefined): string {
  if (!n) return "";
  return n === 1 ? " 1 run of this build is being analysed again." : ` ${n} runs of this build are being analysed again.`;
}
