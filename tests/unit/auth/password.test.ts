import bcrypt from "bcryptjs";
import { describe, expect, it } from "vitest";
import { hashPassword, verifyPassword } from "@/lib/auth/password";

describe("hashPassword", () => {
  it("produces a bcrypt hash at cost 11 that verifies only the same password", async () => {
    const h = await hashPassword("a long enough passphrase");
    expect(h).toMatch(/^\$2[aby]\$11\$/);
    expect(bcrypt.getRounds(h)).toBe(11);
    await expect(verifyPassword("a long enough passphrase", h)).resolves.toBe(true);
    await expect(verifyPassword("a long enough passphrasE", h)).resolves.toBe(false);
  });

  // OpenBSD bcrypt test vector "U*U" at cost 5, as carried in the jBCrypt and John the Ripper test
  // suites (value quoted from memory; it verifies, so it was remembered right).
  it("verifies a published bcrypt vector", async () => {
    await expect(verifyPassword("U*U", "$2a$05$CCCCCCCCCCCCCCCCCCCCC.E5YPO9kmyuRGyh0XouQYb4YMJKvyOeW")).resolves.toBe(true);
  });
});
