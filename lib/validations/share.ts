import { z } from "zod";

/** The expiry choices the lead is offered, in days; any whole number up to the maximum is accepted. */
export const SHARE_EXPIRY_CHOICES = [1, 7, 30, 90] as const;
export const MAX_SHARE_DAYS = 90;

export const createShareLinkSchema = z.object({
  expiresInDays: z
    .number({ error: "expiresInDays must be a whole number of days" })
    .int("expiresInDays must be a whole number of days")
    .min(1, "A share link lasts at least 1 day")
    .max(MAX_SHARE_DAYS, `A share link lasts at most ${MAX_SHARE_DAYS} days`),
});

/** What newToken() makes: 32 random bytes as base64url, 43 characters. Anything else names no link. */
export const shareTokenSchema = z.string().regex(/^[A-Za-z0-9_-]{43}$/);
