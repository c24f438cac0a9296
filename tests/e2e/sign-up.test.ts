import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { launchIsolated, screenshotPath } from "../helpers/browser";
import { appUrl } from "../helpers/http";
import { uniqueEmail } from "../helpers/people";

describe("starting a crew in the browser", () => {
  let browser: Browser;
  let close: () => Promise<void>;
  beforeAll(async () => ({ browser, close } = await launchIsolated()));
  afterAll(async () => close?.());

  it("lists every problem beside its field, then creates the account and crew", async () => {
    const page = await browser.newPage();
    await page.goto(`${appUrl}/sign-up`);
    await page.getByRole("button", { name: "Create account and crew" }).click();
    await page.getByText("Enter your name").waitFor();
    expect(await page.getByText("Use at least 10 characters").isVisible()).toBe(true);
    expect(await page.getByText("Give the crew a name").isVisible()).toBe(true);
    await page.screenshot({ path: screenshotPath("sign-up-errors"), fullPage: true });

    await page.getByLabel("Your name").fill("Sam Founder");
    await page.getByLabel("E-mail").fill(uniqueEmail("founder"));
    await page.getByLabel("Password").fill("long enough passphrase");
    await page.getByLabel("Crew name").fill("Estuary Boat Club");
    await page.getByRole("button", { name: "Create account and crew" }).click();
    await page.waitForURL(`${appUrl}/dashboard`);
    await page.getByText("Estuary Boat Club — you are lead in this crew.").waitFor();
  });
});
