import { describe, expect, it } from "vitest";
import { mailRetryDelayS } from "@/lib/mail/outbox";

// Exponential back-off with a cap is common practice for retrying a mail relay (RFC 5321 §4.5.4.1
// asks senders to retry a failed delivery, at least 30 minutes apart for a real queue, and to give up
// after days; our outbox retries sooner at first because the usual fault is our own relay restarting).
describe("mailRetryDelayS", () => {
  it("doubles from the base on every failure", () => {
    expect([1, 2, 3, 4, 5].map((n) => mailRetryDelayS(n, 30))).toEqual([30, 60, 120, 240, 480]);
  });

  it("never waits more than six hours", () => {
    expect(mailRetryDelayS(40, 30)).toBe(6 * 3600);
  });

  it("treats a zero or negative count as the first retry", () => {
    expect(mailRetryDelayS(0, 5)).toBe(5);
  });
});
