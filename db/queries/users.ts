import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { users, type User } from "@/db/schema";

export type PublicUser = Pick<User, "id" | "email" | "name" | "units" | "alertEmails">;

export const publicColumns = {
  id: users.id,
  email: users.email,
  name: users.name,
  units: users.units,
  alertEmails: users.alertEmails,
};

export async function getUserById(id: number): Promise<PublicUser | null> {
  const [row] = await db().select(publicColumns).from(users).where(eq(users.id, id)).limit(1);
  return row ?? null;
}

/** Includes the password hash: for sign-in only. */
export async function getUserWithSecretByEmail(email: string): Promise<User | null> {
  const [row] = await db().select().from(users).where(eq(users.email, email.toLowerCase())).limit(1);
  return row ?? null;
}
