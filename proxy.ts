import { NextResponse, type NextRequest } from "next/server";

/** Passes the requested path to server components so sign-in can send people back to it. */
export function proxy(req: NextRequest) {
  const headers = new Headers(req.headers);
  headers.set("x-sortie-path", req.nextUrl.pathname + req.nextUrl.search);
  return NextResponse.next({ request: { headers } });
}

export const config = {
  matcher: ["/((?!api|_next/static|_next/image|favicon.ico|fonts).*)"],
};
