/**
 * In Chromium: a pilot uploads every real recording in ../shared/reference/real (ten NMEA captures
 * from the GPSD regression suite, ten GPX files from GPX libraries' test folders, the sea LoRa
 * dataset's CSV files; SOURCES.md there) through the upload page, as a new user would. None may be
 * refused; the untimed GPX says its time figures are not available, and the radio dataset's debrief
 * says its range fit is not credible rather than quoting a range.
 *
 * The files are read in place, never copied into the project; without that folder the suite is
 * reported as skipped.
 */
import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { demoCrew, demoPassword } from "@/db/demo-crew";
import { launchBrowser, screenshotPath } from "../helpers/browser";
import { appUrl } from "../helpers/http";

const REAL = path.resolve(process.cwd(), "../shared/reference/real");
const present = fs.existsSync(path.join(REAL, "expected.json"));
const absent = present ? "" : " — skipped: ../shared/reference/real (the public test data) is not in this workplace";
const files = present
  ? ["nmea", "gpx", "radio/ocean-lora-buoy"].flatMap((dir) =>
      fs
        .readdirSync(path.join(REAL, dir))
        .filter((f) => /\.(log|gpx|csv)$/.test(f))
        .map((f) => path.join(REAL, dir, f)),
    )
  : [];
const pilot = demoCrew.members.find((m) => m.role === "pilot")!;
const FINISHED = /Ready\.|Already uploaded|Could not be read|limit|failed|error/i;

describe.skipIf(!present)(`every real recording through the upload page${absent}`, () => {
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

  it(
    "reads all of them: none refused",
    async () => {
      expect(files.length).toBe(34);
      await page.getByLabel("Log files").setInputFiles(files);
      await page.getByRole("button", { name: "Upload" }).click();
      const items = page.locator("li.panel");
      await items.first().waitFor();
      // Uploaded one after another; wait until each card says how it ended (generous: a busy 2-core machine).
      await page.waitForFunction(
        ({ count, finished }) => {
          const cards = [...document.querySelectorAll("li.panel")];
          return cards.length === count && cards.every((c) => new RegExp(finished, "i").test(c.textContent ?? ""));
        },
        { count: files.length, finished: FINISHED.source },
        { timeout: 900_000, polling: 1000 },
      );
      const texts = await items.allTextContents();
      const refused = texts.filter((t) => !/Ready\.|Already uploaded/.test(t));
      expect(refused).toEqual([]);
      await page.screenshot({ path: screenshotPath("real-uploads"), fullPage: true });
    },
    960_000,
  );

  const figure = (label: string) => page.locator(`[data-figure="${label}"]`);
  const openRun = async (fileName: string) => {
    const card = page.locator("li.panel", { hasText: fileName });
    await card.getByRole("link", { name: /Open/ }).first().click();
    await page.waitForURL(/\/runs\/\d+$/);
    await page.getByRole("heading", { level: 1 }).waitFor();
  };

  it("shows a track with one placeholder time on every point by its geometry, its time figures not available", async () => {
    await page.goto(`${appUrl}/runs/upload`);
    await page.getByLabel("Log files").setInputFiles(path.join(REAL, "gpx/Mojstrovka.gpx"));
    await page.getByRole("button", { name: "Upload" }).click();
    await page.locator("li.panel", { hasText: /Ready\.|Already uploaded/ }).waitFor({ timeout: 120_000 });
    await openRun("Mojstrovka.gpx");
    expect(await figure("Duration").textContent()).toContain("Not available");
    expect(await figure("Distance travelled").textContent()).toMatch(/2\.70 km/);
    await page.screenshot({ path: screenshotPath("real-untimed-gpx"), fullPage: false });
  }, 180_000);

  it("says the sea LoRa dataset's range fit is not credible and quotes no range", async () => {
    await page.goto(`${appUrl}/runs/upload`);
    await page.getByLabel("Log files").setInputFiles(path.join(REAL, "radio/ocean-lora-buoy/DERIVED_22dBm_rx-rssi_at_buoy-position.csv"));
    await page.getByRole("button", { name: "Upload" }).click();
    await page.locator("li.panel", { hasText: /Ready\.|Already uploaded/ }).waitFor({ timeout: 120_000 });
    await openRun("DERIVED_22dBm");
    expect(await figure("Range estimate").textContent()).toContain("No credible fit");
    const note = page.getByTestId("range-not-credible");
    await note.scrollIntoViewIfNeeded();
    expect(await note.textContent()).toMatch(/No credible fit, so no range is quoted: distance explains only \d+ %/);
    const chart = page.getByTestId("range-chart");
    await chart.scrollIntoViewIfNeeded();
    await page.waitForFunction(() => Number(document.querySelector('[data-testid="range-chart"]')?.getAttribute("data-points")) > 0, null, { timeout: 60_000 });
    expect(Number(await chart.getAttribute("data-points"))).toBeGreaterThan(1000);
    await page.screenshot({ path: screenshotPath("real-radio-range"), fullPage: false });
  }, 180_000);
});
