import { randomBytes } from "node:crypto";
import { signUp } from "@/lib/accounts/sign-up";
import { getUserById } from "@/db/queries/users";
import type { Actor } from "@/lib/auth/actor";

/** A unique address per test so files can share one database without clashing (RFC 2606 domain). */
export function uniqueEmail(label: string): string {
  return `${label}-${randomBytes(4).toString("hex")}@crew.example`;
}

export const testPassword = "correct horse battery";

/** Creates a user who leads a new crew, through the same code as the sign-up form. */
export async function newLead(label: string, crewName = `${label} crew`) {
  const email = uniqueEmail(label);
  const { userId, crewId } = await signUp({ name: `${label} lead`, email, password: testPassword, crewName });
  const user = (await getUserById(userId))!;
  const actor: Actor = { user, via: "session" };
  return { email, userId, crewId, actor };
}
