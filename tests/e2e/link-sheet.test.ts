/**
 * In Chromium: the demo crew's lead opens a build (invented demo data), fills in its link sheet,
 * puts return to home on a second channel, sees the sheet check say so, fixes it and sees the
 * finding go; the page fits a 390 px phone; the checklist prints without the app's navigation.
 * Screenshots land in tests/e2e/screenshots/.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { demoCrew, demoPassword } from "@/db/demo-crew";
import { launchBrowser, screenshotPath } from "../helpers/browser";
import { appUrl } from "../helpers/http";
import { tinyPng } from "../helpers/tiny-png";

const lead = demoCrew.members.find((m) => m.role === "lead")!;
const BUILD = demoCrew.builds[0].name;

/** The simulator's rover: arm on 5, mission on 6, return to home on 7 (scripts/simulator). */
const sheet: [number, string, string?, string?, string?, string?, string?][] = [
  [1, "roll"],
  [2, "throttle"],
  [3, "pitch"],
  [4, "yaw"],
  [5, "arm", "A", "2", "1800", "2100", "2000"],
  [6, "mission", "C", "3", "1400", "1600", "1000"],
  [7, "return-to-home", "C", "3", "1800", "2100", "2000"],
];

async function setChannel(page: Page, [ch, fn, sw, pos, min, max, fs]: (typeof sheet)[number]) {
  await page.locator(`#ls-${ch}-function`).selectOption(fn);
  await page.locator(`#ls-${ch}-switch`).fill(sw ?? "");
  await page.locator(`#ls-${ch}-positions`).selectOption(pos ?? "");
  await page.locator(`#ls-${ch}-engageMinUs`).fill(min ?? "");
  await page.locator(`#ls-${ch}-engageMaxUs`).fill(max ?? "");
  await page.locator(`#ls-${ch}-failsafeUs`).fill(fs ?? "");
}

async function save(page: Page) {
  const status = page.getByTestId("link-sheet-status");
  await page.getByRole("button", { name: "Save link sheet" }).click();
  await expect.poll(() => status.textContent(), { timeout: 15_000 }).toMatch(/Saved|Nothing had changed/);
}

const duplicate = (page: Page) => page.getByTestId("sheet-check").locator('[data-rule="rth-duplicate"]');

describe("the link sheet and its check", () => {
  let ctx: BrowserContext;
  let close: () => Promise<void>;
  let page: Page;
  let buildUrl: string;

  beforeAll(async () => {
    ({ browser: ctx, close } = await launchBrowser());
    page = await ctx.newPage();
    await page.goto(`${appUrl}/sign-in?callbackUrl=%2Fbuilds`);
    await page.getByLabel("E-mail").fill(lead.email);
    await page.getByLabel("Password").fill(demoPassword);
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.waitForURL(`${appUrl}/builds`);
  });
  afterAll(async () => close?.());

  it("opens a build from the list and fills in a consistent sheet", async () => {
    await page.getByRole("link", { name: BUILD, exact: true }).click();
    await page.getByTestId("link-sheet-editor").waitFor();
    buildUrl = page.url();
    for (const row of sheet) await setChannel(page, row);
    // Keyboard: the plan's time is reachable and editable without a pointer.
    await page.locator("#fs-action").focus();
    await page.keyboard.press("Tab");
    expect(await page.evaluate(() => document.activeElement?.id)).toBe("fs-within");
    await page.keyboard.press("Control+A");
    await page.keyboard.type("1.5");
    await save(page);
    await expect.poll(() => duplicate(page).count()).toBe(0);
    await page.getByTestId("sheet-check").locator('[data-rule="arm-missing"]').waitFor({ state: "detached", timeout: 15_000 });
  });

  it("flags return to home on two channels, then clears once fixed", async () => {
    await setChannel(page, [9, "return-to-home", "D", "2", "1800", "2100", "2000"]);
    await save(page);
    await duplicate(page).waitFor({ timeout: 15_000 });
    const text = await duplicate(page).textContent();
    expect(text).toContain("channels 7 and 9");
    expect(text).toContain("Why it matters");
    expect(text).toContain("How to fix");
    // The finding sits in the group of things to fix before the next run.
    expect(await page.getByRole("region", { name: "Fix before the next run" }).locator('[data-rule="rth-duplicate"]').count()).toBe(1);
    await duplicate(page).scrollIntoViewIfNeeded();
    await page.screenshot({ path: screenshotPath("link-sheet-check"), fullPage: true });

    // The same page on a phone: rows stack, nothing wider than the screen.
    const phone = await ctx.newPage();
    await phone.setViewportSize({ width: 390, height: 844 });
    await phone.goto(buildUrl);
    await phone.getByTestId("sheet-check").locator('[data-rule="rth-duplicate"]').waitFor();
    expect(await phone.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    const row = (await phone.locator('[data-channel="9"]').boundingBox())!;
    expect(row.width).toBeLessThanOrEqual(390);
    // Stacked: the channel's function and its failsafe value are on different lines.
    const fn = (await phone.locator("#ls-9-function").boundingBox())!;
    const fs = (await phone.locator("#ls-9-failsafeUs").boundingBox())!;
    expect(fs.y).toBeGreaterThan(fn.y + fn.height - 1);
    await phone.screenshot({ path: screenshotPath("link-sheet-check-390"), fullPage: true });
    await phone.close();

    await setChannel(page, [9, "unused"]);
    await save(page);
    await duplicate(page).waitFor({ state: "detached", timeout: 15_000 });
    expect(await duplicate(page).count()).toBe(0);
  });

  it("lists the build's runs with trend charts and the history of the edits", async () => {
    // Each saved change re-analysed the build's runs with the new sheet: wait until they are back.
    await expect
      .poll(
        async () => {
          await page.reload();
          return page.getByTestId("build-runs").textContent();
        },
        { timeout: 60_000, interval: 1_000 },
      )
      .not.toMatch(/queued|parsing|analysing/);
    await page.getByTestId("build-runs").locator("a").first().waitFor();
    await page.getByTestId("trend-linkMin").locator("canvas").first().waitFor({ timeout: 15_000 });
    expect(Number(await page.getByTestId("trend-linkMin").getAttribute("data-points"))).toBeGreaterThan(0);
    expect(Number(await page.getByTestId("trend-linkMin").getAttribute("data-markers"))).toBeGreaterThan(0);
    const history = await page.getByTestId("build-history").textContent();
    expect(history).toMatch(/Channel 9: function (from )?unused → +(to )?return to home/);
    expect(history).toContain(lead.name);
  });

  it("adds a photo straight to storage and shows it", async () => {
    await page.locator("#photo-file").setInputFiles({ name: "mudlark-side.png", mimeType: "image/png", buffer: tinyPng() });
    await page.locator("#photo-caption").fill("Mast antenna, left side");
    await page.getByRole("button", { name: "Add photo" }).click();
    const img = page.getByTestId("build-photos").getByRole("img", { name: "Mast antenna, left side" });
    await img.waitFor({ timeout: 15_000 });
    await img.scrollIntoViewIfNeeded();
    await expect.poll(() => img.evaluate((el: HTMLImageElement) => el.complete && el.naturalWidth), { timeout: 15_000 }).toBe(1);
  });

  it("prints a checklist without the app's navigation", async () => {
    await page.getByRole("link", { name: "Pre-run checklist" }).click();
    await page.getByTestId("checklist").waitFor();
    const text = await page.getByTestId("checklist").textContent();
    expect(text).toContain("Commands return to home");
    expect(text).toContain("propellers off");
    await page.screenshot({ path: screenshotPath("build-checklist"), fullPage: true });
    await page.emulateMedia({ media: "print" });
    expect(await page.locator("aside").first().isVisible()).toBe(false);
    expect(await page.getByRole("button", { name: "Print" }).isVisible()).toBe(false);
    await page.screenshot({ path: screenshotPath("build-checklist-print"), fullPage: true });
    await page.emulateMedia({ media: "screen" });
  });
});
