import type { Env } from "@/lib/env";

/**
 * Response headers every page and API answer carries (ASVS V14.4). Pure, so the policy can be
 * unit-tested; proxy.ts applies it per request (the nonce and the origins come from runtime settings).
 */

function originOf(url: string | undefined): string | null {
  if (!url) return null;
  try {
    return new URL(url.replace(/\{[a-z]\}/g, "0")).origin;
  } catch {
    return null;
  }
}

/** Where browsers reach object storage: presigned PUTs (uploads) and GETs (build photos). */
export function objectStoreOrigins(e: Pick<Env, "S3_ENDPOINT" | "S3_PUBLIC_ENDPOINT" | "S3_BUCKET" | "S3_REGION" | "S3_FORCE_PATH_STYLE">): string[] {
  const endpoint = e.S3_PUBLIC_ENDPOINT ?? e.S3_ENDPOINT;
  if (!endpoint) {
    // AWS itself: virtual-hosted or path-style addresses, depending on S3_FORCE_PATH_STYLE.
    return e.S3_FORCE_PATH_STYLE ? [`https://s3.${e.S3_REGION}.amazonaws.com`] : [`https://${e.S3_BUCKET}.s3.${e.S3_REGION}.amazonaws.com`];
  }
  const u = new URL(endpoint);
  if (e.S3_FORCE_PATH_STYLE) return [u.origin];
  return [`${u.protocol}//${e.S3_BUCKET}.${u.host}`];
}

export interface CspOptions {
  /** Per-request nonce for Next's inline bootstrap scripts; absent on API answers. */
  nonce?: string;
  /** `next dev` evaluates modules with eval() for fast refresh. */
  dev?: boolean;
}

/** ASVS V14.4.3 (CSP), V14.4.7 (frame-ancestors: no framing, so no clickjacking). */
export function contentSecurityPolicy(e: Env, opts: CspOptions = {}): string {
  const store = objectStoreOrigins(e);
  const tiles = originOf(e.MAP_TILE_URL);
  const script = ["'self'"];
  if (opts.nonce) script.push(`'nonce-${opts.nonce}'`, "'strict-dynamic'");
  if (opts.dev) script.push("'unsafe-eval'");
  const directives: Record<string, string[]> = {
    "default-src": ["'self'"],
    "script-src": script,
    // uPlot and Leaflet position their elements with inline style attributes, and React's style
    // props render as style attributes; a nonce cannot cover attributes, so styles stay inline-able.
    "style-src": ["'self'", "'unsafe-inline'"],
    "img-src": ["'self'", "data:", "blob:", ...store, ...(tiles ? [tiles] : [])],
    "font-src": ["'self'"],
    // Uploads go straight from the browser to the object store (presigned PUT, multipart parts).
    "connect-src": ["'self'", ...store],
    "worker-src": ["'self'", "blob:"],
    "frame-ancestors": ["'none'"],
    "base-uri": ["'self'"],
    "form-action": ["'self'"],
    "object-src": ["'none'"],
  };
  return Object.entries(directives)
    .map(([k, v]) => `${k} ${[...new Set(v)].join(" ")}`)
    .join("; ");
}

/** Headers besides the CSP; `path` chooses the Referrer-Policy (shared debriefs send none). */
export function securityHeaders(e: Env, path: string): Record<string, string> {
  const h: Record<string, string> = {
    // ASVS V14.4.4: no MIME sniffing of uploads or JSON.
    "x-content-type-options": "nosniff",
    // ASVS V14.4.6: a share link's URL is its key, so /share/* sends no Referer at all.
    "referrer-policy": path.startsWith("/share/") ? "no-referrer" : "strict-origin-when-cross-origin",
    // ASVS V14.4 (defence in depth): the app needs no camera, microphone or browser location.
    "permissions-policy": "camera=(), microphone=(), geolocation=()",
  };
  // ASVS V14.4.5 (HSTS): only when the app is really served over https, or local http would break.
  if (e.NODE_ENV === "production" && e.APP_URL.startsWith("https://")) {
    h["strict-transport-security"] = "max-age=31536000; includeSubDomains";
  }
  return h;
}
