import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { hashToken, newToken, sameHash } from "@/lib/auth/secrets";

describe("newToken", () => {
  it("carries 256 bits as URL-safe base64 after the prefix", () => {
    const t = newToken("sortie_");
    expect(t.startsWith("sortie_")).toBe(true);
    const body = t.slice("sortie_".length);
    expect(body).toMatch(/^[A-Za-z0-9_-]+$/);
    expect(Buffer.from(body, "base64url")).toHaveLength(32);
  });

  it("never repeats", () => {
    const seen = new Set(Array.from({ length: 1000 }, () => newToken()));
    expect(seen.size).toBe(1000);
  });
});

describe("hashToken", () => {
  // FIPS 180-4 test vector: SHA-256("abc") (NIST CSRC "Examples with intermediate values", SHA256.pdf).
  it("is SHA-256 in hex", () => {
    expect(hashToken("abc")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  });

  it("agrees with node:crypto on arbitrary input", () => {
    const t = newToken();
    expect(hashToken(t)).toBe(createHash("sha256").update(t).digest("hex"));
  });
});

describe("sameHash", () => {
  it("compares equal hashes and rejects different or shorter ones", () => {
    const a = hashToken("x");
    expect(sameHash(a, a)).toBe(true);
    expect(sameHash(a, hashToken("y"))).toBe(false);
    expect(sameHash(a, a.slice(0, 10))).toBe(false);
  });
});
