import type { Readable } from "node:stream";
import type { ByteSource } from "@/lib/parsers/types";

/** Wraps a Node stream as a ByteSource that reports how many bytes have passed. */
export async function* countingSource(stream: Readable, onBytes: (n: number) => void): AsyncGenerator<Uint8Array> {
  for await (const chunk of stream) {
    const buf = chunk as Buffer;
    onBytes(buf.length);
    yield buf;
  }
}

/**
 * Reads at least `bytes` (or everything) from `source` so the format can be sniffed, and returns
 * that head as text plus a source that replays it before the rest.
 */
export async function peek(source: ByteSource, bytes = 64 * 1024): Promise<{ head: string; source: ByteSource }> {
  const it = source[Symbol.asyncIterator]();
  const seen: (Uint8Array | string)[] = [];
  let size = 0;
  let finished = false;
  while (size < bytes) {
    const r = await it.next();
    if (r.done) {
      finished = true;
      break;
    }
    seen.push(r.value);
    size += typeof r.value === "string" ? r.value.length : r.value.byteLength;
  }
  const decoder = new TextDecoder("utf-8");
  const head = seen.map((c) => (typeof c === "string" ? c : decoder.decode(c, { stream: true }))).join("");
  async function* replay(): AsyncGenerator<Uint8Array | string> {
    for (const c of seen) yield c;
    if (finished) return;
    for (;;) {
      const r = await it.next();
      if (r.done) return;
      yield r.value;
    }
  }
  return { head, source: replay() };
}
