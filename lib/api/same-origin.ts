/**
 * Cross-site request forgery check for route handlers (ASVS V4.2.2, V13.2.3). Pure: the wrapper
 * passes the request's headers and the app's own origin, this decides.
 *
 * Only cookie-authenticated unsafe requests are checked: a Bearer token is never sent by a browser
 * on its own, so a forged cross-site request cannot carry one.
 */
export const UNSAFE_METHODS = new Set(["POST", "PUT", "PATCH", "DELETE"]);

export interface SameOriginInput {
  method: string;
  /** Authorization header (Bearer token requests are exempt). */
  authorization: string | null;
  cookie: string | null;
  origin: string | null;
  secFetchSite: string | null;
  referer: string | null;
  /** The Host the browser addressed, so a deployment reached by another name still works for itself. */
  host: string | null;
  /** APP_URL's origin. */
  appOrigin: string;
}

/** next-auth's session cookie, plain or __Secure- prefixed, whole or split into chunks (.0, .1…). */
export function hasSessionCookie(cookie: string | null): boolean {
  if (!cookie) return false;
  return cookie.split(";").some((part) => /^(__Secure-)?next-auth\.session-token(\.\d+)?$/.test(part.split("=")[0].trim()));
}

function originOf(url: string): string | null {
  try {
    const u = new URL(url);
    return u.protocol === "http:" || u.protocol === "https:" ? u.origin : null;
  } catch {
    return null;
  }
}

function matches(origin: string, input: SameOriginInput): boolean {
  if (origin === input.appOrigin) return true;
  return input.host !== null && new URL(origin).host === input.host.toLowerCase();
}

/** Why the request must be refused as cross-site, or null when it may go on. */
export function crossSiteProblem(input: SameOriginInput): string | null {
  if (!UNSAFE_METHODS.has(input.method.toUpperCase())) return null;
  if (input.authorization) return null;
  // No session cookie means no ambient credential to abuse; the handler answers 401 itself.
  if (!hasSessionCookie(input.cookie)) return null;

  // Browsers send Origin on every cross-origin and (today) same-origin unsafe request; "null"
  // (sandboxed frames, some redirects) cannot be matched and is refused.
  if (input.origin !== null) {
    const o = originOf(input.origin);
    return o && matches(o, input) ? null : `Origin ${input.origin} is not this site`;
  }
  // Fetch metadata, for browsers that omit Origin.
  if (input.secFetchSite !== null) {
    return input.secFetchSite === "same-origin" || input.secFetchSite === "none" ? null : `Sec-Fetch-Site ${input.secFetchSite} is not same-origin`;
  }
  if (input.referer !== null) {
    const o = originOf(input.referer);
    return o && matches(o, input) ? null : "The Referer is not this site";
  }
  // None of the three: not a browser's forged request. Current browsers send Origin or
  // Sec-Fetch-Site on every unsafe request (and SameSite=Lax keeps the session cookie off cross-site
  // POSTs anyway), so this is a script holding the cookie itself (e.g. Playwright's request API).
  return null;
}

export function sameOriginInputFromRequest(req: Request, appOrigin: string): SameOriginInput {
  const h = req.headers;
  return {
    method: req.method,
    authorization: h.get("authorization"),
    cookie: h.get("cookie"),
    origin: h.get("origin"),
    secFetchSite: h.get("sec-fetch-site"),
    referer: h.get("referer"),
    host: h.get("host"),
    appOrigin,
  };
}
