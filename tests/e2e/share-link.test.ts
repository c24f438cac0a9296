/**
 * In Chromium: the demo crew's lead makes a share link for the seeded demo run (through the API
 * with the browser's own session; placing the share panel on the page is separate), then a fresh
 * signed-out browser opens the link and sees the verdict, drawn charts and the map, fetched from
 * the share routes only. Revoking the link takes the page away. Data: our simulator's invented run.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { demoCrew, demoPassword } from "@/db/demo-crew";
import { launchBrowser, launchIsolated, screenshotPath } from "../helpers/browser";
import { appUrl } from "../helpers/http";

const lead = demoCrew.members.find((m) => m.role === "lead")!;

describe("a shared debrief", () => {
  let ctx: BrowserContext;
  let close: () => Promise<void>;
  let page: Page;
  let guest: { browser: Browser; close: () => Promise<void> };
  let runId: number;
  let link: { id: number; url: string };

  beforeAll(async () => {
    ({ browser: ctx, close } = await launchBrowser());
    page = await ctx.newPage();
    await page.goto(`${appUrl}/sign-in?callbackUrl=%2Fruns`);
    await page.getByLabel("E-mail").fill(lead.email);
    await page.getByLabel("Password").fill(demoPassword);
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.waitForURL(`${appUrl}/runs`);
    guest = await launchIsolated();
  });
  afterAll(async () => {
    await guest?.close();
    await close?.();
  });

  it("lets the lead make a link for the demo run with the browser's session", async () => {
    await page.getByRole("link", { name: "mudlark-flats-loop" }).first().click();
    await page.waitForURL(/\/runs\/\d+$/);
    await page.getByTestId("verdict").waitFor();
    runId = Number(new URL(page.url()).pathname.split("/").pop());
    const res = await page.request.post(`${appUrl}/api/runs/${runId}/share-links`, { data: { expiresInDays: 1 } });
    expect(res.status(), await res.text()).toBe(201);
    link = await res.json();
    expect(link.url).toMatch(/\/share\/[A-Za-z0-9_-]{43}$/);
  });

  it("shows the debrief to a signed-out browser: verdict, charts and map, from the share routes only", async () => {
    const context = await guest.browser.newContext({ viewport: { width: 1280, height: 860 } });
    const shared = await context.newPage();
    const apiCalls: string[] = [];
    shared.on("request", (r) => {
      const u = new URL(r.url());
      if (u.pathname.startsWith("/api/")) apiCalls.push(u.pathname);
    });
    const res = await shared.goto(`${appUrl}${new URL(link.url).pathname}`);
    expect(res?.status()).toBe(200);
    expect(new URL(shared.url()).pathname).toMatch(/^\/share\//);
    await shared.getByTestId("verdict").waitFor();
    expect(await shared.getByTestId("shared-title").textContent()).toContain("mudlark-flats-loop");
    await shared.getByTestId("chart-link").locator("canvas").first().waitFor({ timeout: 30_000 });
    await expect.poll(() => shared.getByTestId("chart-link").getAttribute("data-points").then(Number), { timeout: 30_000 }).toBeGreaterThan(10);
    await expect.poll(() => shared.getByTestId("track-map").getAttribute("data-track-points").then(Number), { timeout: 30_000 }).toBeGreaterThan(10);
    await shared.getByTestId("range-chart").waitFor();
    // No crew navigation, no sign-out, no member e-mails.
    const text = (await shared.locator("body").textContent()) ?? "";
    for (const m of demoCrew.members) expect(text).not.toContain(m.email);
    expect(await shared.getByRole("link", { name: /Runs|Builds|Crew|Settings|overview/ }).count()).toBe(0);
    expect(apiCalls.length).toBeGreaterThan(0);
    expect(apiCalls.every((p) => p.startsWith("/api/share/"))).toBe(true);
    await shared.screenshot({ path: screenshotPath("shared-debrief"), fullPage: true });
    await context.close();
  });

  it("stops working once the lead revokes it", async () => {
    const res = await page.request.delete(`${appUrl}/api/share-links/${link.id}`);
    expect(res.status()).toBe(200);
    const context = await guest.browser.newContext();
    const shared = await context.newPage();
    const gone = await shared.goto(`${appUrl}${new URL(link.url).pathname}`);
    expect(gone?.status()).toBe(404);
    await shared.getByText("This link has expired or was withdrawn").waitFor();
    await context.close();
  });
});
