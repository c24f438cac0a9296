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

  it("sends nothing for an unknown address", async () => {
    const ghost = uniqueEmail("ghost");
    await requestPasswordReset(ghost);
    expect(await mailsTo(ghost)).toEqual([]);
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
