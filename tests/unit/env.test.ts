import { afterEach, describe, expect, it } from "vitest";
import { env, resetEnvCache } from "@/lib/env";

const saved = { ...process.env };
afterEach(() => {
  process.env = { ...saved };
  resetEnvCache();
});

describe("env", () => {
  it("names every invalid setting", () => {
    process.env.DATABASE_URL = "postgres://x";
    process.env.SMTP_URL = "http://mail";
    resetEnvCache();
    expect(() => env()).toThrow(/DATABASE_URL[\s\S]*SMTP_URL|SMTP_URL[\s\S]*DATABASE_URL/);
  });

  it("refuses the local session secret in production", () => {
    process.env = { ...saved, NODE_ENV: "production" } as NodeJS.ProcessEnv;
    delete process.env.NEXTAUTH_SECRET;
    delete process.env.SORTIE_ALLOW_LOCAL_SECRET;
    resetEnvCache();
    expect(() => env()).toThrow(/NEXTAUTH_SECRET/);
  });

  it("reads S3_FORCE_PATH_STYLE as a boolean", () => {
    process.env.S3_FORCE_PATH_STYLE = "false";
    resetEnvCache();
    expect(env().S3_FORCE_PATH_STYLE).toBe(false);
  });
});
