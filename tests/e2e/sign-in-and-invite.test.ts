/**
 * In Chromium against the production build: the demo lead signs in, reaches the overview,
 * invites a member; the invitee opens the e-mailed link, creates an account and lands in the crew.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { demoCrew, demoPassword } from "@/db/demo-crew";
import { launchBrowser, launchIsolated, screenshotPath } from "../helpers/browser";
import { appUrl } from "../helpers/http";
import { linkIn, waitForMail } from "../helpers/inbox";
import { uniqueEmail } from "../helpers/people";

const lead = demoCrew.members.find((m) => m.role === "lead")!;

describe("sign-in and invitation in the browser", () => {
  let ctx: BrowserContext;
  let close: () => Promise<void>;
  let page: Page;
  const invitee = uniqueEmail("newpilot");

  beforeAll(async () => {
    ({ browser: ctx, close } = await launchBrowser());
    page = await ctx.newPage();
  });
  afterAll(async () => close?.());

  it("sends a signed-out visitor to sign-in and back to where they were going", async () => {
    await page.goto(`${appUrl}/crew`);
    await page.waitForURL(/\/sign-in\?callbackUrl=%2Fcrew/);
    expect(await page.getByRole("heading", { name: "Sign in" }).isVisible()).toBe(true);
  });

  it("shows a clear message for a wrong password", async () => {
    await page.getByLabel("E-mail").fill(lead.email);
    await page.getByLabel("Password").fill("not the password");
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.getByText("That e-mail and password do not match an account.").waitFor();
  });

  it("signs the demo lead in and reaches the crew page", async () => {
    await page.getByLabel("Password").fill(demoPassword);
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.waitForURL(`${appUrl}/crew`);
    await page.getByRole("heading", { name: demoCrew.name }).waitFor();
    for (const m of demoCrew.members) expect(await page.locator("#main").getByText(m.email).isVisible()).toBe(true);
  });

  it("shows the overview with the crew's builds and route plans counted", async () => {
    await page.getByRole("link", { name: "Overview" }).first().click();
    await page.waitForURL(`${appUrl}/dashboard`);
    await page.getByRole("heading", { name: /Hello, Maren/ }).waitFor();
    const buildsTile = page.getByRole("link", { name: /Builds/ }).filter({ hasText: String(demoCrew.builds.length) });
    expect(await buildsTile.count()).toBeGreaterThan(0);
    await page.screenshot({ path: screenshotPath("dashboard-desktop"), fullPage: true });
  });

  it("invites a member from the crew page", async () => {
    await page.goto(`${appUrl}/crew`);
    await page.getByLabel("E-mail", { exact: true }).fill(invitee);
    await page.getByLabel("Role", { exact: true }).selectOption("pilot");
    await page.getByRole("button", { name: "Send invitation" }).click();
    await page.getByText(`Invitation sent to ${invitee}`).waitFor();
    await page.locator("#main").getByText(invitee, { exact: true }).waitFor();
    await page.screenshot({ path: screenshotPath("crew-invited"), fullPage: true });
  });

  it("lets the invitee create an account from the e-mailed link and land in the crew", async () => {
    const link = linkIn(await waitForMail(invitee, /invited to join Tidewater Robotics/), "/invite/");
    const other = await launchIsolated();
    try {
      const p = await other.browser.newPage({ viewport: { width: 390, height: 844 } });
      await p.goto(link.replace(/^https?:\/\/[^/]+/, appUrl));
      await p.getByRole("heading", { name: `Join ${demoCrew.name}` }).waitFor();
      await p.getByLabel("Your name").fill("Nia Newcomer");
      await p.getByLabel("Choose a password").fill("a fresh passphrase");
      await p.screenshot({ path: screenshotPath("invite-accept-phone"), fullPage: true });
      await p.getByRole("button", { name: "Create account and join" }).click();
      await p.waitForURL(`${appUrl}/dashboard`);
      await p.getByText(`${demoCrew.name} — you are pilot in this crew.`).waitFor();
      await p.screenshot({ path: screenshotPath("dashboard-phone"), fullPage: true });
    } finally {
      await other.close();
    }
  });
});
