import { NextResponse, type NextRequest } from "next/server";

/** Passes the requested path to server components so sign-in can send people back to it. */
export function proxy(req: NextRequest) {
  const headers = new Headers(req.headers);
  headers.set("x-sortie-path", req.nextUrl.pathname + req.nextUrl.search);
  const res = NextResponse.next({ request: { headers } });
  // A shared debrief's URL is its key: never pass it on as a Referer, and keep it out of search indexes.
  if (req.nextUrl.pathname.startsWith("/share/")) {
    res.headers.set("referrer-policy", "no-referrer");
    res.headers.set("x-robots-tag", "noindex, nofollow");
  }
  return res;
}

export const config = {
  matcher: ["/((?!api|_next/static|_next/image|favicon.ico|fonts).*)"],
};
