/**
 * In Chromium: a lead opens a bench run's debrief (no GPS; the transmitter switched off for 10 s;
 * invented data from tests/helpers/bench-log.ts), records it as the build's failsafe bench test
 * with the debrief's button, sees it on the build page, changes the link sheet and sees the test
 * marked stale there and in the checklist. The bench summary is the analysis contract's, written
 * onto the run (markAsBenchRun), so this runs before issue 12's analysis lands.
 * Screenshots land in tests/e2e/screenshots/.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { benchCsv, benchSheet, markAsBenchRun } from "../helpers/bench-log";
import { launchBrowser, screenshotPath } from "../helpers/browser";
import { appUrl, Client } from "../helpers/http";
import { newLead, testPassword } from "../helpers/people";
import { settledRun, uploadLog } from "../helpers/uploads";

const BUILD = "Heron quad";

describe("recording a failsafe bench test", () => {
  let ctx: BrowserContext;
  let close: () => Promise<void>;
  let page: Page;
  let buildId: number;
  let runId: number;

  beforeAll(async () => {
    const lead = await newLead("e2e-bench", "Saltmarsh Flyers (invented)");
    const c = new Client();
    expect(await c.signIn(lead.email, testPassword)).toBeNull();
    const made = await c.post("/api/builds", { crewId: lead.crewId, name: BUILD, vehicleType: "multirotor", receiver: "Invented 868 receiver", bandMhz: 868 });
    expect(made.status).toBe(201);
    buildId = ((await made.json()) as { id: number }).id;
    expect((await c.request(`/api/builds/${buildId}/link-sheet`, { method: "PUT", json: benchSheet() })).status).toBe(200);
    const up = await uploadLog(c, "heron-bench-failsafe.csv", benchCsv(), { crewId: lead.crewId, buildId });
    runId = up.runId;
    expect((await settledRun(c, runId)).status).toBe("ready");
    await markAsBenchRun(runId);

    ({ browser: ctx, close } = await launchBrowser());
    page = await ctx.newPage();
    await page.goto(`${appUrl}/sign-in?callbackUrl=${encodeURIComponent(`/builds/${buildId}`)}`);
    await page.getByLabel("E-mail").fill(lead.email);
    await page.getByLabel("Password").fill(testPassword);
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.waitForURL(`${appUrl}/builds/${buildId}`);
  });
  afterAll(async () => close?.());

  it("shows what to do when the build has no bench test yet", async () => {
    const section = page.locator('section[aria-labelledby="bench-test"]');
    await section.getByTestId("bench-test-empty").waitFor();
    expect(await section.textContent()).toContain("with the propellers off");
    expect(await section.getByRole("note").textContent()).toContain("propellers off and wheels lifted");
    await section.scrollIntoViewIfNeeded();
    await section.screenshot({ path: screenshotPath("bench-test-empty") });
  });

  it("records the bench run from its debrief", async () => {
    await page.goto(`${appUrl}/runs/${runId}`);
    const panel = page.getByTestId("bench-test-panel");
    await panel.waitFor();
    expect(await panel.textContent()).toContain("Acted as planned");
    await panel.scrollIntoViewIfNeeded();
    await panel.screenshot({ path: screenshotPath("bench-test-debrief-button") });
    await page.getByLabel(/Note for the build record/).fill("On the stand, props off, transmitter off 10 s");
    await page.getByRole("button", { name: `Record as the failsafe bench test of ${BUILD}` }).click();
    // The action revalidates the page: the form gives way to the record itself.
    await panel.getByTestId("bench-test-recorded").waitFor({ timeout: 15_000 });
    expect(await panel.getByTestId("bench-test-recorded").textContent()).toMatch(new RegExp(`^Recorded as the failsafe bench test of ${BUILD} on .* by e2e-bench lead: Acted as planned\.$`));
    await panel.screenshot({ path: screenshotPath("bench-test-debrief-recorded") });
  });

  it("shows the latest test on the build page, then marks it stale after a link-sheet change", async () => {
    await page.getByTestId("bench-test-panel").getByRole("link", { name: BUILD }).click();
    await page.waitForURL(new RegExp(`/builds/${buildId}`));
    const section = page.locator('section[aria-labelledby="bench-test"]');
    await section.getByTestId("bench-test-latest").waitFor();
    expect(await section.getByTestId("bench-test-result").textContent()).toBe("Acted as planned");
    const text = await section.textContent();
    expect(text).toContain("0.4 s after the loss (channel 8 at its failsafe value)");
    expect(text).toContain("On the stand, props off, transmitter off 10 s");
    await section.scrollIntoViewIfNeeded();
    await section.screenshot({ path: screenshotPath("bench-test-build-section") });

    // The receiver's failsafe value on channel 8 changes: the recorded test no longer covers it.
    await page.locator("#ls-8-failsafeUs").fill("1950");
    await page.getByRole("button", { name: "Save link sheet" }).click();
    const status = page.getByTestId("link-sheet-status");
    await expect.poll(() => status.textContent(), { timeout: 15_000 }).toMatch(/^Saved 1 change\..* 1 run of this build is being analysed again\.$/);
    await section.getByTestId("bench-test-stale").waitFor({ timeout: 15_000 });
    expect(await section.getByTestId("bench-test-stale").textContent()).toMatch(/^Stale: the link sheet changed on \d{1,2} \w{3} \d{4}( at \d\d:\d\d UTC)? after this test — test again\.$/);
    await section.scrollIntoViewIfNeeded();
    await section.screenshot({ path: screenshotPath("bench-test-build-stale") });

    await page.goto(`${appUrl}/builds/${buildId}/checklist`);
    expect(await page.getByTestId("checklist-bench-test").textContent()).toMatch(/^The failsafe bench test of .* is stale: the link sheet changed on /);
  });

  it("fits a 390 px phone", async () => {
    const phone = await ctx.newPage();
    await phone.setViewportSize({ width: 390, height: 844 });
    await phone.goto(`${appUrl}/builds/${buildId}`);
    const section = phone.locator('section[aria-labelledby="bench-test"]');
    await section.getByTestId("bench-test-latest").waitFor();
    expect(await phone.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await section.scrollIntoViewIfNeeded();
    await section.screenshot({ path: screenshotPath("bench-test-build-390") });
    await phone.close();
  });
});
