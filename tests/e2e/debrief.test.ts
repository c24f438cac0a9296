/**
 * In Chromium: a lead opens the seeded demo run (our simulator's invented data), sees every chart
 * canvas and the map drawn, selects an event and watches the charts' x range follow, steps with
 * the keyboard, adds a note, signs off, and looks at the page on a phone in field mode.
 * Screenshots land in tests/e2e/screenshots/.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { demoCrew, demoPassword } from "@/db/demo-crew";
import { launchBrowser, screenshotPath } from "../helpers/browser";
import { appUrl } from "../helpers/http";

const lead = demoCrew.members.find((m) => m.role === "lead")!;

const xRange = (page: Page, panel: string) =>
  page.getByTestId(`chart-${panel}`).evaluate((el) => [Number(el.getAttribute("data-x-min")), Number(el.getAttribute("data-x-max"))]);

describe("the debrief page", () => {
  let ctx: BrowserContext;
  let close: () => Promise<void>;
  let page: Page;

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

  it("lists the crew's runs with sorting and filters held in the URL", async () => {
    await page.getByTestId("runs-table").waitFor();
    await page.screenshot({ path: screenshotPath("runs-list"), fullPage: true });
    await page.getByLabel("Build").selectOption({ label: "Mudlark" });
    await page.getByRole("button", { name: "Filter" }).click();
    await page.waitForURL(/build=\d+/);
    const titles = await page.getByTestId("runs-table").locator("tbody tr td:first-child").allTextContents();
    expect(titles.length).toBeGreaterThan(0);
    expect(titles.every((t) => t.includes("mudlark"))).toBe(true);
    await page.getByRole("link", { name: /^Duration/ }).click();
    await page.waitForURL(/sort=duration/);
    expect(page.url()).toMatch(/build=\d+/);
  });

  it("draws every chart and the map for the demo run", async () => {
    await page.getByRole("link", { name: "mudlark-flats-loop" }).first().click();
    await page.getByTestId("verdict").waitFor();
    await page.getByTestId("chart-link").locator("canvas").first().waitFor({ timeout: 30_000 });
    await expect.poll(() => page.getByTestId("chart-link").getAttribute("data-points").then(Number), { timeout: 30_000 }).toBeGreaterThan(10);
    for (const id of ["link", "altitude", "speed", "voltage", "current", "xte"]) {
      const canvas = page.getByTestId(`chart-${id}`).locator("canvas").first();
      expect(await canvas.isVisible(), `chart ${id}`).toBe(true);
      const box = (await canvas.boundingBox())!;
      expect(box.width).toBeGreaterThan(200);
    }
    await expect.poll(() => page.getByTestId("track-map").getAttribute("data-track-points").then(Number), { timeout: 30_000 }).toBeGreaterThan(10);
    expect(await page.locator("[data-testid=track-map] .leaflet-container, [data-testid=track-map].leaflet-container").count()).toBeGreaterThan(0);
    await page.getByTestId("range-chart").waitFor();
    await page.screenshot({ path: screenshotPath("debrief-desktop"), fullPage: true });
  });

  it("zooms every chart to an event chosen in the table, and back out", async () => {
    const before = await xRange(page, "link");
    const row = page.getByTestId("events-table").locator("tbody tr").filter({ hasText: "Link lost" }).first();
    await row.getByRole("button").click();
    await expect.poll(() => xRange(page, "link").then(([a, b]) => b - a), { timeout: 15_000 }).toBeLessThan(before[1] - before[0]);
    const zoomed = await xRange(page, "link");
    // One shared x range: another chart shows the same window.
    await expect.poll(() => xRange(page, "voltage"), { timeout: 15_000 }).toEqual(zoomed);
    const eventId = await row.getAttribute("data-event-id");
    await expect.poll(() => page.getByTestId("track-map").getAttribute("data-selected-event"), { timeout: 15_000 }).toBe(eventId);
    await page.screenshot({ path: screenshotPath("debrief-event-selected"), fullPage: false });

    await page.keyboard.press("0");
    await expect.poll(() => xRange(page, "link").then(([a, b]) => b - a), { timeout: 15_000 }).toBeGreaterThan(zoomed[1] - zoomed[0]);
    await page.keyboard.press("n");
    await expect.poll(() => page.getByTestId("range-readout").textContent(), { timeout: 15_000 }).not.toMatch(/^Whole run/);
  });

  it("takes a note and a lead's sign-off", async () => {
    const note = `Antenna moved to the mast top before the next run (${Date.now()}).`;
    await page.getByLabel("Add a note").fill(note);
    await page.getByRole("button", { name: "Add note" }).click();
    await page.getByTestId("notes").getByText(note).waitFor();
    await page.getByRole("button", { name: "Sign off this debrief" }).click();
    await page.getByTestId("sign-off").getByText("Signed off", { exact: true }).waitFor();
    expect(await page.getByTestId("sign-off").textContent()).toContain(lead.name);
  });

  it("fits a phone and switches to field mode", async () => {
    const phone = await ctx.newPage();
    await phone.setViewportSize({ width: 390, height: 844 });
    await phone.goto(page.url());
    await phone.getByTestId("chart-link").locator("canvas").first().waitFor({ timeout: 30_000 });
    // Measure the width once the map and range chart have drawn too.
    await expect.poll(() => phone.getByTestId("track-map").getAttribute("data-track-points").then(Number), { timeout: 30_000 }).toBeGreaterThan(10);
    await phone.getByTestId("range-chart").locator("canvas").first().waitFor({ timeout: 30_000 });
    const canvas = (await phone.getByTestId("chart-link").locator("canvas").first().boundingBox())!;
    expect(canvas.width).toBeLessThanOrEqual(390);
    const scrollWidth = await phone.evaluate(() => document.documentElement.scrollWidth);
    expect(scrollWidth).toBeLessThanOrEqual(390);
    await phone.getByTestId("field-mode").click();
    expect(await phone.evaluate(() => document.documentElement.dataset.fieldMode)).toBe("on");
    await phone.screenshot({ path: screenshotPath("debrief-phone-field-mode"), fullPage: true });
    await phone.getByTestId("field-mode").click();
    await phone.close();
  });
});
