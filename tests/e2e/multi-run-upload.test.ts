/**
 * In Chromium: a pilot uploads one GPX holding two sorties three hours apart (our own file, invented
 * positions at the demo field). The upload card lists both runs with their verdicts and links; each
 * run's page says which part of the file it is and links the other; the runs list marks the parts.
 * Desktop and a 390 px phone, reached with the keyboard.
 */
import { randomBytes } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { demoCrew, demoPassword } from "@/db/demo-crew";
import { launchBrowser, screenshotPath } from "../helpers/browser";
import { appUrl } from "../helpers/http";
import { twoTrackGpx } from "../helpers/multi-run-logs";

const pilot = demoCrew.members.find((m) => m.role === "pilot")!;
const fileName = `two-sorties-${randomBytes(3).toString("hex")}.gpx`;
const log = twoTrackGpx(fileName, fileName);

describe("a file holding two runs, in the browser", () => {
  let ctx: BrowserContext;
  let close: () => Promise<void>;
  let page: Page;
  let partIds: number[] = [];

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

  it("lists both runs of the upload on its card, each with its verdict and a link", async () => {
    await page.getByLabel("Log files").setInputFiles({ name: fileName, mimeType: "application/gpx+xml", buffer: Buffer.from(log.body) });
    await page.getByRole("button", { name: "Upload" }).click();
    const list = page.getByTestId("upload-runs");
    await list.waitFor({ timeout: 60_000 });
    await page.getByText("This file holds 2 separate runs, each with its own debrief.").waitFor();
    const items = list.getByRole("listitem");
    expect(await items.count()).toBe(2);
    expect(await items.nth(0).textContent()).toContain("Part 1 of 2");
    expect(await items.nth(0).textContent()).toContain("2026-03-14 09:00 UTC");
    expect(await items.nth(1).textContent()).toContain("2026-03-14 12:00 UTC");
    for (let i = 0; i < 2; i++) expect(await items.nth(i).textContent()).toMatch(/Clear|Watch|Act/);
    const links = list.getByRole("link");
    partIds = await Promise.all([0, 1].map(async (i) => Number((await links.nth(i).getAttribute("href"))!.split("/").pop())));
    expect(partIds[1]).not.toBe(partIds[0]);
    await page.screenshot({ path: screenshotPath("upload-two-runs"), fullPage: true });
    await page.setViewportSize({ width: 390, height: 844 });
    await page.screenshot({ path: screenshotPath("upload-two-runs-phone"), fullPage: true });
    // Nothing wider than the phone's screen.
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
  });

  it("opens part 2 from the keyboard; its page says which part it is and links part 1", async () => {
    await page.getByRole("link", { name: "Open part 2 of 2" }).focus();
    await page.keyboard.press("Enter");
    await page.waitForURL(`${appUrl}/runs/${partIds[1]}`);
    const nav = page.getByRole("navigation", { name: "Runs from the same file" });
    await nav.waitFor();
    expect(await nav.textContent()).toContain(`Part 2 of 2 of ${fileName}`);
    expect(await nav.locator('[aria-current="page"]').textContent()).toContain("Part 2");
    await page.screenshot({ path: screenshotPath("run-part-2-phone"), fullPage: false });
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await page.setViewportSize({ width: 1280, height: 860 });
    await page.screenshot({ path: screenshotPath("run-part-2"), fullPage: false });
    await nav.getByRole("link", { name: /Part 1/ }).click();
    await page.waitForURL(`${appUrl}/runs/${partIds[0]}`);
    expect(await page.getByRole("navigation", { name: "Runs from the same file" }).textContent()).toContain(`Part 1 of 2 of ${fileName}`);
  });

  it("marks the two runs as parts in the runs list", async () => {
    await page.goto(`${appUrl}/runs`);
    for (const [i, id] of partIds.entries()) {
      const row = page.locator(`tr[data-run-id="${id}"]`);
      expect(await row.getByTestId("run-part").textContent()).toBe(`part ${i + 1} of 2`);
    }
    await page.screenshot({ path: screenshotPath("runs-list-parts"), fullPage: false });
  });
});
