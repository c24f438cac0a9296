import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { users } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";

export async function updateProfile(actor: Actor, input: { name: string; units: "metric" | "imperial"; alertEmails: boolean }): Promise<void> {
  await db().update(users).set(input).where(eq(users.id, actor.user.id));
}
