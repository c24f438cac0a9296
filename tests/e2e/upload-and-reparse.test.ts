/**
 * In Chromium: a pilot uploads a log with the progress bar moving, corrects a column in the map
 * form, re-parses and sees the run ready; a broken file shows its message and its original can
 * be downloaded. The log is our own simulator's output (demo data).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { demoCrew, demoPassword } from "@/db/demo-crew";
import { simulateRun } from "@/scripts/simulator/simulate-run";
import { toCsv } from "@/scripts/simulator/write-logs";
import { launchBrowser, screenshotPath } from "../helpers/browser";
import { appUrl } from "../helpers/http";

const pilot = demoCrew.members.find((m) => m.role === "pilot")!;
// Four laps' worth of samples makes a file big enough to watch the bar move on a throttled link.
const sim = simulateRun({ seed: 99, waypoints: [...demoCrew.routePlans[0].waypoints, ...demoCrew.routePlans[0].waypoints.slice(1), ...demoCrew.routePlans[0].waypoints.slice(1)] });
const csv = toCsv(sim).replace("rssi_dbm", "rx_signal_level_x");
const rows = csv.trim().split("\n").length - 1;

describe("uploading a log in the browser", () => {
  let ctx: BrowserContext;
  let close: () => Promise<void>;
  let page: Page;

  beforeAll(async () => {
    ({ browser: ctx, close } = await launchBrowser());
    page = await ctx.newPage();
    await page.goto(`${appUrl}/sign-in?callbackUrl=%2Fruns%2Fupload`);
    await page.getByLabel("E-mail").fill(pilot.email);
    await page.getByLabel("Password").fill(demoPassword);
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.waitForURL(`${appUrl}/runs/upload`);
  });
  afterAll(async () => close?.());

  it("shows the bytes going up, then the run being read", async () => {
    const cdp = await ctx.newCDPSession(page);
    await cdp.send("Network.enable");
    // Throttle uploads to ~400 KB/s so the progress bar has time to move on loopback.
    await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 10, downloadThroughput: -1, uploadThroughput: 400 * 1024 });
    await page.evaluate(() => {
      (window as unknown as { seen: number[] }).seen = [];
      new MutationObserver(() => {
        for (const el of document.querySelectorAll('[role="progressbar"]')) (window as unknown as { seen: number[] }).seen.push(Number(el.getAttribute("aria-valuenow")));
      }).observe(document.body, { subtree: true, attributes: true, childList: true });
    });
    await page.getByLabel("Log files").setInputFiles({ name: "mudlark-four-laps.csv", mimeType: "text/csv", buffer: Buffer.from(csv) });
    await page.getByLabel("Build").selectOption({ label: "Mudlark" });
    await page.getByRole("button", { name: "Upload" }).click();
    await page.getByRole("progressbar", { name: "Sending to storage" }).waitFor();
    await page.screenshot({ path: screenshotPath("upload-progress"), fullPage: true });
    await page.getByText("Ready.").waitFor({ timeout: 60_000 });
    await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });
    const seen = await page.evaluate(() => (window as unknown as { seen: number[] }).seen);
    const between = seen.filter((v) => v > 0 && v < 100);
    expect(new Set(between).size).toBeGreaterThan(2);
  });

  it("lets the pilot correct a column and re-parse", async () => {
    await page.getByRole("link", { name: "Open the run" }).click();
    await page.waitForURL(/\/runs\/\d+$/);
    await page.getByRole("heading", { name: "Column map" }).waitFor();
    expect(await page.getByTestId("carries").textContent()).not.toContain("RSSI (dBm)");
    const field = page.getByLabel("What column rx_signal_level_x carries");
    await field.waitFor();
    expect(await field.inputValue()).toBe("ignore");
    await field.selectOption("rssi");
    await page.getByLabel("Unit of column rx_signal_level_x").selectOption("dBm");
    await page.screenshot({ path: screenshotPath("column-map-form"), fullPage: true });
    await page.getByRole("button", { name: "Re-parse with this map" }).click();
    await page.getByText("Re-parsing with this map…").waitFor();
    // The re-parse stores the column as RSSI: the page now says the log carries it.
    await expect.poll(async () => (await page.getByTestId("carries").textContent().catch(() => "")) ?? "", { timeout: 30_000 }).toContain("RSSI (dBm)");
    expect(await page.locator("dd").filter({ hasText: rows.toLocaleString("en") }).count()).toBeGreaterThan(0);
  });

  it("shows why a broken file could not be read and offers the original", async () => {
    await page.goto(`${appUrl}/runs/upload`);
    const junk = Buffer.from(Array.from({ length: 3000 }, (_, i) => (i * 131) % 256));
    await page.getByLabel("Log files").setInputFiles({ name: "garbled.csv", mimeType: "text/csv", buffer: junk });
    await page.getByRole("button", { name: "Upload" }).click();
    await page.getByText(/Could not be read:/).waitFor({ timeout: 30_000 });
    await page.getByRole("link", { name: "Open the run" }).click();
    await page.getByRole("heading", { name: "This log could not be read" }).waitFor();
    await page.screenshot({ path: screenshotPath("run-failed"), fullPage: true });
    const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: "Download the original" }).click()]);
    const file = await download.path();
    const { readFileSync } = await import("node:fs");
    expect(readFileSync(file).equals(junk)).toBe(true);
  });
});
