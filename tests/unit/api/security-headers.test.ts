import { describe, expect, it } from "vitest";
import { contentSecurityPolicy, objectStoreOrigins, securityHeaders } from "@/lib/api/security-headers";
import type { Env } from "@/lib/env";

const env = {
  NODE_ENV: "production",
  APP_URL: "http://localhost:3100",
  S3_ENDPOINT: "http://127.0.0.1:4579",
  S3_PUBLIC_ENDPOINT: undefined,
  S3_BUCKET: "sortie-logs",
  S3_REGION: "us-east-1",
  S3_FORCE_PATH_STYLE: true,
  MAP_TILE_URL: "https://tile.example.org/{z}/{x}/{y}.png",
} as unknown as Env;

const directives = (csp: string) => Object.fromEntries(csp.split("; ").map((d) => [d.split(" ")[0], d.split(" ").slice(1)]));

describe("contentSecurityPolicy", () => {
  it("has the fixed directives (ASVS V14.4.3, V14.4.7)", () => {
    const d = directives(contentSecurityPolicy(env));
    expect(d["default-src"]).toEqual(["'self'"]);
    expect(d["frame-ancestors"]).toEqual(["'none'"]);
    expect(d["base-uri"]).toEqual(["'self'"]);
    expect(d["form-action"]).toEqual(["'self'"]);
    expect(d["object-src"]).toEqual(["'none'"]);
    expect(d["style-src"]).toEqual(["'self'", "'unsafe-inline'"]);
  });

  it("allows scripts by nonce, never 'unsafe-inline' (ASVS V14.4.3)", () => {
    const d = directives(contentSecurityPolicy(env, { nonce: "abc123" }));
    expect(d["script-src"]).toEqual(["'self'", "'nonce-abc123'", "'strict-dynamic'"]);
    expect(contentSecurityPolicy(env)).not.toContain("unsafe-eval");
    expect(contentSecurityPolicy(env, { dev: true })).toContain("'unsafe-eval'");
  });

  it("lets the browser reach the object store and the tile server", () => {
    const d = directives(contentSecurityPolicy(env));
    expect(d["connect-src"]).toEqual(["'self'", "http://127.0.0.1:4579"]);
    expect(d["img-src"]).toEqual(["'self'", "data:", "blob:", "http://127.0.0.1:4579", "https://tile.example.org"]);
  });

  it("uses the public S3 endpoint when set, and the bucket host for virtual-hosted addressing", () => {
    expect(objectStoreOrigins({ ...env, S3_PUBLIC_ENDPOINT: "https://files.example.org/" })).toEqual(["https://files.example.org"]);
    expect(objectStoreOrigins({ ...env, S3_ENDPOINT: "https://s3.example.org", S3_FORCE_PATH_STYLE: false })).toEqual(["https://sortie-logs.s3.example.org"]);
    expect(objectStoreOrigins({ ...env, S3_ENDPOINT: undefined, S3_FORCE_PATH_STYLE: false })).toEqual(["https://sortie-logs.s3.us-east-1.amazonaws.com"]);
  });
});

describe("securityHeaders", () => {
  it("sends nosniff, the referrer and permissions policies (ASVS V14.4.4, V14.4.6)", () => {
    const h = securityHeaders(env, "/runs");
    expect(h["x-content-type-options"]).toBe("nosniff");
    expect(h["referrer-policy"]).toBe("strict-origin-when-cross-origin");
    expect(h["permissions-policy"]).toBe("camera=(), microphone=(), geolocation=()");
  });

  it("keeps no-referrer on shared debriefs", () => {
    expect(securityHeaders(env, "/share/abc")["referrer-policy"]).toBe("no-referrer");
  });

  it("sends HSTS only in production over https (ASVS V14.4.5)", () => {
    expect(securityHeaders(env, "/")["strict-transport-security"]).toBeUndefined();
    expect(securityHeaders({ ...env, APP_URL: "https://sortie.example.org" }, "/")["strict-transport-security"]).toMatch(/max-age=31536000/);
    expect(securityHeaders({ ...env, NODE_ENV: "development", APP_URL: "https://sortie.example.org" }, "/")["strict-transport-security"]).toBeUndefined();
  });
});
