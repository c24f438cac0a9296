import { describe, expect, it } from "vitest";
import { requestPasswordReset, resetPassword } from "@/lib/accounts/password-reset";
import { Client } from "../helpers/http";
import { linkIn, mailsTo, tokenFromLink, waitForMail } from "../helpers/inbox";
import { newLead, testPassword, uniqueEmail } from "../helpers/people";

describe("password reset by e-mail", () => {
  it("mails a one-time link that sets a new password", async () => {
    const { email } = await newLead("reset");
    await requestPasswordReset(email);
    const link = linkIn(await waitForMail(email, /Reset your Sortie password/), "/reset/");
    const page = await new Client().get(new URL(link).pathname);
    expect(await page.text()).toContain("Choose a new password");

    await resetPassword(tokenFromLink(link), "a brand new passphrase");
    expect(await new Client().signIn(email, testPassword)).toBe("CredentialsSignin");
    expect(await new Client().signIn(email, "a brand new passphrase")).toBeNull();
    await expect(resetPassword(tokenFromLink(link), "yet another passphrase")).rejects.toThrow(/expired or was already used/);
  });

  // OWASP ASVS 4.0.3 V3.3.3: changing the password can end the other sessions; here it always does,
  // because a reset usually means the old password (and so its sessions) may be in other hands.
  it("ends every session signed in with the old password", async () => {
    const { email } = await newLead("reset-ends");
    const before = new Client();
    expect(await before.signIn(email, testPassword)).toBeNull();
    expect((await before.get("/api/me")).status).toBe(200);
    await requestPasswordReset(email);
    const link = linkIn(await waitForMail(email, /Reset your Sortie password/), "/reset/");
    await resetPassword(tokenFromLink(link), "a brand new passphrase");
    expect((await before.get("/api/me")).status).toBe(401);
    const after = new Client();
    // Sessions are compared at millisecond precision: one signed in right after the reset works.
    expect(await after.signIn(email, "a brand new passphrase")).toBeNull();
    expect((await after.get("/api/me")).status).toBe(200);
  });

  it("sends nothing for an unknown address", async () => {
    const ghost = uniqueEmail("ghost");
    await requestPasswordReset(ghost);
    expect(await mailsTo(ghost)).toEqual([]);
  });
});

describe("sign-out", () => {
  // OWASP ASVS 4.0.3 V3.3.1: logout invalidates the session token, so a copy of it (another tab,
  // a stolen cookie) cannot resume the session.
  it("ends the session on the server, so a copied cookie is refused", async () => {
    const { email } = await newLead("sign-out");
    const browser = new Client();
    expect(await browser.signIn(email, testPassword)).toBeNull();
    const copy = browser.withBase(browser.base);
    expect((await copy.get("/api/me")).status).toBe(200);
    const csrf = (await (await browser.get("/api/auth/csrf")).json()) as { csrfToken: string };
    const out = await browser.request("/api/auth/signout", {
      method: "POST",
      headers: { "content-type": "application/x-www-form-urlencoded" },
      body: new URLSearchParams({ csrfToken: csrf.csrfToken, json: "true" }).toString(),
    });
    expect(out.status).toBe(200);
    expect((await copy.get("/api/me")).status).toBe(401);
    // Signing in again opens a new session.
    const again = new Client();
    expect(await again.signIn(email, testPassword)).toBeNull();
    expect((await again.get("/api/me")).status).toBe(200);
  });
});

describe("sign-in rate limit", () => {
  it("blocks an account after repeated failures, even with the right password", async () => {
    const { email } = await newLead("limit");
    const c = new Client();
    for (let i = 0; i < 8; i++) expect(await c.signIn(email, "wrong password!")).toBe("CredentialsSignin");
    expect(await new Client().signIn(email, testPassword)).toBe("RateLimited");
  });
});
