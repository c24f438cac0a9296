/**
 * Calls a server action over HTTP the way the browser does: POST to a page that uses it with
 * `Next-Action: <id>`, the app's Origin, `Accept: text/x-component` and the argument list encoded
 * by React's own `encodeReply` (a multipart body: field "0" holds the JSON of the argument list,
 * a FormData argument becomes "$K<n>" with its entries under "_<n>_<name>"). The answer is React's
 * flight stream; `readFlight` reads enough of it to get the action's return value.
 */
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import { join } from "node:path";
import { appUrl, type Client } from "./http";

const require = createRequire(import.meta.url);
// The same client React build Next ships to the browser; encodeReply needs no bundler runtime.
const { encodeReply } = require("next/dist/compiled/react-server-dom-webpack/client.node.js") as {
  encodeReply: (value: unknown) => Promise<string | FormData>;
};

export interface ManifestAction {
  id: string;
  /** Source file relative to the project, e.g. "app/(app)/crew/actions.ts". */
  filename: string;
  exportedName: string;
  /** Page entries that import the action, e.g. "app/(app)/crew/page". */
  workers: string[];
}

/** Every server action of the production build, from `<distDir>/server/server-reference-manifest.json`. */
export function manifestActions(distDir = process.env.SORTIE_DIST_DIR || ".next-test"): ManifestAction[] {
  const file = join(process.cwd(), distDir, "server", "server-reference-manifest.json");
  let text: string;
  try {
    text = readFileSync(file, "utf8");
  } catch {
    throw new Error(`${file} is missing: the production build is made by \`npm test\` before the integration tests`);
  }
  const manifest = JSON.parse(text) as {
    node: Record<string, { filename: string; exportedName: string; workers: Record<string, unknown> }>;
  };
  return Object.entries(manifest.node).map(([id, a]) => ({ id, filename: a.filename, exportedName: a.exportedName, workers: Object.keys(a.workers) }));
}

/** "app/(app)/runs/[runId]/page" → "/runs/[runId]" (route groups dropped). */
export function pagePath(worker: string): string {
  const segments = worker.replace(/^app\//, "").replace(/\/?page$/, "").split("/").filter((s) => s && !/^\(.*\)$/.test(s));
  return "/" + segments.join("/");
}

export interface ActionResult {
  status: number;
  /** The whole response body (flight rows), for leak checks. */
  body: string;
  headers: Headers;
  /** The action's return value (undefined for a void action or a thrown error). */
  value: unknown;
  /** The action threw: production hides the message and sends only a digest. */
  thrown: boolean;
  /** Where redirect() sent the caller (x-action-redirect), without the ";push"/";replace" suffix. */
  redirect: string | null;
}

/** Splits a flight stream into rows: `<hex id>:<payload>\n`, text rows `<id>:T<hex byte length>,<text>`. */
export function flightRows(bytes: Buffer): Map<string, string> {
  const rows = new Map<string, string>();
  let i = 0;
  while (i < bytes.length) {
    const colon = bytes.indexOf(0x3a, i);
    if (colon < 0) break;
    const id = bytes.subarray(i, colon).toString("utf8");
    // Hint rows (":HL[…]") have no id; anything else that is not hex means we lost the framing.
    if (id !== "" && !/^[0-9a-f]+$/.test(id)) break;
    let j = colon + 1;
    if (bytes[j] === 0x54 /* T */) {
      const comma = bytes.indexOf(0x2c, j);
      const len = parseInt(bytes.subarray(j + 1, comma).toString("utf8"), 16);
      rows.set(id, "T" + bytes.subarray(comma + 1, comma + 1 + len).toString("utf8"));
      i = comma + 1 + len;
      continue;
    }
    const nl = bytes.indexOf(0x0a, j);
    const end = nl < 0 ? bytes.length : nl;
    if (id !== "") rows.set(id, bytes.subarray(j, end).toString("utf8"));
    i = end + 1;
  }
  return rows;
}

const THROWN = Symbol("thrown");

/** Resolves the plain-data part of a flight value: "$@n" / "$n" row references, "$undefined", "$$" escapes. */
function resolve(value: unknown, rows: Map<string, string>, depth = 0): unknown {
  if (depth > 20) return value;
  if (typeof value === "string") {
    if (value === "$undefined") return undefined;
    if (value.startsWith("$$")) return value.slice(1);
    const ref = /^\$@?([0-9a-f]+)$/.exec(value);
    if (ref) {
      const row = rows.get(ref[1]);
      if (row === undefined) return value;
      if (row.startsWith("E")) return THROWN;
      if (row.startsWith("T")) return row.slice(1);
      try {
        return resolve(JSON.parse(row), rows, depth + 1);
      } catch {
        return value;
      }
    }
    return value;
  }
  if (Array.isArray(value)) return value.map((v) => resolve(v, rows, depth + 1));
  if (value && typeof value === "object") {
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, resolve(v, rows, depth + 1)]));
  }
  return value;
}

/** Reads the action's return value from row 0 (`{"a": <value or "$@n">, "f": <tree>, "b": <build id>}`). */
export function readFlight(body: Buffer): { value: unknown; thrown: boolean } {
  const rows = flightRows(body);
  const root = rows.get("0");
  if (root === undefined) return { value: undefined, thrown: false };
  if (root.startsWith("E")) return { value: undefined, thrown: true };
  let parsed: unknown;
  try {
    parsed = JSON.parse(root);
  } catch {
    return { value: undefined, thrown: false };
  }
  if (!parsed || typeof parsed !== "object" || !("a" in parsed)) return { value: undefined, thrown: false };
  const raw = (parsed as { a: unknown }).a;
  const value = resolve(raw, rows);
  return value === THROWN ? { value: undefined, thrown: true } : { value, thrown: false };
}

export interface CallOptions {
  /** Page the form lives on; the action runs there (and the page re-renders after a revalidation). */
  page: string;
  /** Defaults to the app's own origin. */
  origin?: string | null;
  /** Extra request headers, e.g. a Bearer token. */
  headers?: Record<string, string>;
}

/** `args` as the browser passes them: `[prevState, formData]` for useActionState, `[formData]` for a plain form action. */
export async function callAction(client: Client, actionId: string, args: unknown[], opts: CallOptions): Promise<ActionResult> {
  const encoded = await encodeReply(args);
  const headers: Record<string, string> = {
    "next-action": actionId,
    accept: "text/x-component",
    ...opts.headers,
  };
  const origin = opts.origin === undefined ? new URL(appUrl).origin : opts.origin;
  if (origin !== null) headers.origin = origin;
  if (typeof encoded === "string") headers["content-type"] = "text/plain;charset=UTF-8";
  const res = await client.request(opts.page, { method: "POST", headers, body: encoded });
  const bytes = Buffer.from(await res.arrayBuffer());
  const redirectHeader = res.headers.get("x-action-redirect");
  const { value, thrown } = readFlight(bytes);
  return {
    status: res.status,
    body: bytes.toString("utf8"),
    headers: res.headers,
    value,
    thrown,
    redirect: redirectHeader ? redirectHeader.split(";")[0] : null,
  };
}

/** A FormData from plain fields (what the browser collects from the form's inputs). */
export function formOf(fields: Record<string, string | number | undefined>): FormData {
  const fd = new FormData();
  for (const [k, v] of Object.entries(fields)) if (v !== undefined) fd.append(k, String(v));
  return fd;
}
