import { NextResponse, type NextRequest } from "next/server";
import { databaseAnswering } from "@/lib/api/database-probe";
import { contentSecurityPolicy, securityHeaders } from "@/lib/api/security-headers";
import { unavailablePage } from "@/lib/api/unavailable-page";
import { env } from "@/lib/env";

/**
 * Runs on every page and API request: answers 503 for pages while the database is down, passes the requested path to server components (so sign-in
 * can send people back to it) and sets the security headers (ASVS V14.4). Done here rather than in
 * next.config.ts headers(), which are fixed at build time, because the CSP carries a per-request
 * nonce and the S3 / map-tile origins and HTTPS come from runtime settings.
 */
export async function proxy(req: NextRequest) {
  const e = env();
  const path = req.nextUrl.pathname;
  const isApi = path.startsWith("/api/");
  // Next reads the nonce from the request's CSP header and puts it on its own inline and chunk
  // scripts (every page is rendered per request: the root layout reads a cookie).
  const nonce = isApi ? undefined : Buffer.from(crypto.getRandomValues(new Uint8Array(16))).toString("base64");
  const csp = contentSecurityPolicy(e, { nonce, dev: e.NODE_ENV === "development" });

  // Pages need the database to render; during an outage they get one clear 503 page (API routes
  // answer 503 JSON themselves, lib/api/handler.ts). /api/health reports the outage to balancers.
  if (!isApi && !(await databaseAnswering())) {
    const down = new NextResponse(unavailablePage(), {
      status: 503,
      headers: { "content-type": "text/html; charset=utf-8", "retry-after": "10", "cache-control": "no-store" },
    });
    down.headers.set("content-security-policy", csp);
    for (const [k, v] of Object.entries(securityHeaders(e, path))) down.headers.set(k, v);
    return down;
  }

  const headers = new Headers(req.headers);
  headers.set("x-sortie-path", path + req.nextUrl.search);
  if (!isApi) headers.set("content-security-policy", csp);
  const res = NextResponse.next({ request: { headers } });

  res.headers.set("content-security-policy", csp);
  for (const [k, v] of Object.entries(securityHeaders(e, path))) res.headers.set(k, v);
  // A shared debrief's URL is its key: keep it out of search indexes (no-referrer is set above).
  if (path.startsWith("/share/")) res.headers.set("x-robots-tag", "noindex, nofollow");
  return res;
}

export const config = {
  // Static chunks and fonts get their headers from next.config.ts.
  matcher: ["/((?!_next/static|_next/image|favicon.ico|fonts).*)"],
};
