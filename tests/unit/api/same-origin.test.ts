import { describe, expect, it } from "vitest";
import { crossSiteProblem, hasSessionCookie, type SameOriginInput } from "@/lib/api/same-origin";

// ASVS 4.0.3 V4.2.2 / V13.2.3: cookie-authenticated unsafe requests must come from the app's own
// origin; the Origin / Sec-Fetch-Site / Referer order follows the OWASP CSRF Prevention Cheat Sheet
// ("Verifying Origin With Standard Headers", "Fetch Metadata headers").
const base: SameOriginInput = {
  method: "POST",
  authorization: null,
  cookie: "next-auth.session-token=abc",
  origin: null,
  secFetchSite: null,
  referer: null,
  host: "localhost:3100",
  appOrigin: "http://localhost:3100",
};
const check = (over: Partial<SameOriginInput>) => crossSiteProblem({ ...base, ...over });

describe("crossSiteProblem", () => {
  it("lets safe methods through whatever their origin", () => {
    for (const method of ["GET", "HEAD", "OPTIONS"]) expect(check({ method, origin: "https://evil.example" })).toBeNull();
  });

  it("refuses a cross-site POST, PUT, PATCH or DELETE carrying the session cookie", () => {
    for (const method of ["POST", "PUT", "PATCH", "DELETE", "delete"]) expect(check({ method, origin: "https://evil.example" })).toMatch(/evil/);
  });

  it("accepts APP_URL's origin and the request's own host", () => {
    expect(check({ origin: "http://localhost:3100" })).toBeNull();
    expect(check({ origin: "http://sortie.internal:8080", host: "sortie.internal:8080" })).toBeNull();
  });

  it("refuses a look-alike origin (other port, scheme or a suffix)", () => {
    expect(check({ origin: "http://localhost:3101" })).not.toBeNull();
    expect(check({ origin: "https://localhost:3100", host: "other:1" })).not.toBeNull();
    expect(check({ origin: "http://localhost:3100.evil.example" })).not.toBeNull();
  });

  it('refuses Origin "null" and unparsable origins', () => {
    expect(check({ origin: "null" })).not.toBeNull();
    expect(check({ origin: "not a url" })).not.toBeNull();
  });

  it("falls back to Sec-Fetch-Site when Origin is absent", () => {
    expect(check({ secFetchSite: "same-origin" })).toBeNull();
    expect(check({ secFetchSite: "same-site" })).not.toBeNull();
    expect(check({ secFetchSite: "cross-site" })).not.toBeNull();
  });

  it("falls back to Referer last", () => {
    expect(check({ referer: "http://localhost:3100/runs/1" })).toBeNull();
    expect(check({ referer: "https://evil.example/page" })).not.toBeNull();
  });

  it("lets through a cookie request that names no source at all (a script, not a browser)", () => {
    expect(check({})).toBeNull();
  });

  it("exempts Bearer-token requests: a browser never adds one on its own", () => {
    expect(check({ authorization: "Bearer sortie_x", origin: "https://evil.example" })).toBeNull();
    expect(check({ authorization: "Bearer sortie_x", cookie: null })).toBeNull();
  });

  it("leaves requests without a session cookie to the handler's own 401", () => {
    expect(check({ cookie: null, origin: "https://evil.example" })).toBeNull();
    expect(check({ cookie: "sortie-crew=3", origin: "https://evil.example" })).toBeNull();
  });
});

describe("hasSessionCookie", () => {
  it("knows next-auth's cookie names, prefixed or chunked", () => {
    expect(hasSessionCookie("a=1; next-auth.session-token=x")).toBe(true);
    expect(hasSessionCookie("__Secure-next-auth.session-token=x")).toBe(true);
    expect(hasSessionCookie("__Secure-next-auth.session-token.0=x; __Secure-next-auth.session-token.1=y")).toBe(true);
    expect(hasSessionCookie("next-auth.csrf-token=x; sortie-crew=1")).toBe(false);
    expect(hasSessionCookie(null)).toBe(false);
  });
});
