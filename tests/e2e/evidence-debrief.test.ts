/**
 * In Chromium: the demo crew's lead opens the seeded bench failsafe test (our generator's invented
 * log: no GPS, RSSI on channel 14, return to home on channel 8) and the seeded GPX track (positions
 * only), and reads what each debrief says it could and could not assess — on a desktop, on a
 * 390 px phone, and on the bench test's share page. Screenshots land in tests/e2e/screenshots/.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { safetyTexts } from "@/components/ui/safety-texts";
import { demoCrew, demoPassword } from "@/db/demo-crew";
import { BENCH_WORDS } from "@/lib/analysis/evidence";
import { launchBrowser, launchIsolated, screenshotPath } from "../helpers/browser";
import { appUrl } from "../helpers/http";

const lead = demoCrew.members.find((m) => m.role === "lead")!;

async function openRun(page: Page, title: string): Promise<string> {
  await page.goto(`${appUrl}/runs`);
  await page.getByRole("link", { name: title }).first().click();
  await page.waitForURL(/\/runs\/\d+$/);
  await page.getByTestId("verdict").waitFor();
  return page.url();
}

const text = async (page: Page, testId: string) => ((await page.getByTestId(testId).textContent()) ?? "").replace(/\s+/g, " ");

async function fitsPhone(page: Page) {
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
}

describe("debriefs that say what a log cannot show", () => {
  let ctx: BrowserContext;
  let close: () => Promise<void>;
  let page: Page;
  let benchUrl: string;
  let gpxUrl: string;

  beforeAll(async () => {
    ({ browser: ctx, close } = await launchBrowser());
    page = await ctx.newPage();
    await page.goto(`${appUrl}/sign-in?callbackUrl=%2Fruns`);
    await page.getByLabel("E-mail").fill(lead.email);
    await page.getByLabel("Password").fill(demoPassword);
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.waitForURL(`${appUrl}/runs`);
  });
  afterAll(async () => close?.());

  it("shows the bench test in its bench layout: link and failsafe only, the bench caution, no map", async () => {
    benchUrl = await openRun(page, "heron-bench-failsafe");
    const notice = await text(page, "bench-notice");
    expect(notice).toContain(BENCH_WORDS.title);
    expect(notice).toContain(safetyTexts.bench);
    const verdict = await text(page, "verdict");
    expect(verdict).toContain("Not assessed: GPS — the log has no usable GPS fix");
    expect(verdict).toContain("Not assessed: route — no route plan is attached to the run");
    expect(verdict).not.toContain("No rule fired");
    const figures = await text(page, "summary-figures");
    expect(figures).toContain("RSSI from channel 14");
    expect(figures).toContain("commanded: 0.4 s after the loss (channel 8 at its failsafe value)");
    expect(figures).toContain("flown: not logged (no mode column, no track)");
    for (const gone of ["Distance travelled", "Farthest from home", "Range estimate"]) expect(figures).not.toContain(gone);
    // The link chart reads the RSSI the analysis derived from channel 14.
    const link = page.getByTestId("chart-link");
    await link.locator("canvas").first().waitFor({ timeout: 30_000 });
    await expect.poll(() => link.getAttribute("data-points").then(Number), { timeout: 30_000 }).toBeGreaterThan(10);
    expect(await link.textContent()).toContain("RSSI from channel 14 — the link metric judged");
    expect(await page.getByTestId("track-map").count()).toBe(0);
    expect(await page.getByTestId("range-chart").count()).toBe(0);
    const table = await text(page, "events-table");
    expect(table).toContain("Failsafe (acted as planned)");
    expect(table).not.toContain("From home");
    await page.screenshot({ path: screenshotPath("debrief-bench-desktop"), fullPage: true });
  });

  it("fits the bench debrief on a phone", async () => {
    const phone = await ctx.newPage();
    await phone.setViewportSize({ width: 390, height: 844 });
    await phone.goto(benchUrl);
    await phone.getByTestId("bench-notice").waitFor();
    await phone.getByTestId("chart-link").locator("canvas").first().waitFor({ timeout: 30_000 });
    await fitsPhone(phone);
    await phone.screenshot({ path: screenshotPath("debrief-bench-390"), fullPage: true });
    await phone.close();
  });

  it("says on the GPX track's debrief that link, failsafe and battery were not assessed, and how home was placed", async () => {
    gpxUrl = await openRun(page, "sandpiper-flats-loop");
    const verdict = await text(page, "verdict");
    expect(verdict).toContain("Not assessed: link — the log has no link metric");
    expect(verdict).toContain("Not assessed: failsafe —");
    expect(verdict).toContain("Not assessed: battery — the log has no battery voltage");
    expect(verdict).not.toContain("the link held");
    const link = page.locator('[data-figure="Link minimum"]');
    expect((await link.textContent()) ?? "").toContain("Not assessed");
    await expect.poll(() => page.getByTestId("track-map").getAttribute("data-track-points").then(Number), { timeout: 30_000 }).toBeGreaterThan(10);
    const legend = (await page.getByRole("group", { name: "Map legend" }).textContent()) ?? "";
    expect(legend).toContain("Home: the first good fix (the log shows no arming)");
    expect(legend).toMatch(/Mission start at \d+:\d\d, at the vehicle's first movement/);
    expect(await page.locator(".sortie-mission-start").count()).toBe(1);
    expect(await page.locator(".sortie-home").getAttribute("title")).toBe("Home: the first good fix (the log shows no arming)");
    await page.screenshot({ path: screenshotPath("debrief-gpx-desktop"), fullPage: true });
  });

  it("fits the GPX debrief on a phone", async () => {
    const phone = await ctx.newPage();
    await phone.setViewportSize({ width: 390, height: 844 });
    await phone.goto(gpxUrl);
    await phone.getByTestId("verdict").waitFor();
    await expect.poll(() => phone.getByTestId("track-map").getAttribute("data-track-points").then(Number), { timeout: 30_000 }).toBeGreaterThan(10);
    await fitsPhone(phone);
    await phone.screenshot({ path: screenshotPath("debrief-gpx-390"), fullPage: true });
    await phone.close();
  });

  it("shows a signed-out reader the bench layout on the share page", async () => {
    const runId = Number(new URL(benchUrl).pathname.split("/").pop());
    const res = await page.request.post(`${appUrl}/api/runs/${runId}/share-links`, { data: { expiresInDays: 1 } });
    expect(res.status(), await res.text()).toBe(201);
    const { url } = (await res.json()) as { url: string };
    const guest = await launchIsolated();
    try {
      const context = await guest.browser.newContext({ viewport: { width: 390, height: 844 } });
      const shared = await context.newPage();
      await shared.goto(`${appUrl}${new URL(url).pathname}`);
      await shared.getByTestId("bench-notice").waitFor();
      expect(await text(shared, "verdict")).toContain("Not assessed: GPS — the log has no usable GPS fix");
      await shared.getByTestId("chart-link").locator("canvas").first().waitFor({ timeout: 30_000 });
      expect(await shared.getByTestId("track-map").count()).toBe(0);
      await fitsPhone(shared);
      await shared.screenshot({ path: screenshotPath("share-bench-390"), fullPage: true });
    } finally {
      await guest.close();
    }
  });
});
