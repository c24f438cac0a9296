import { db } from "@/db/client";
import { getUserWithSecretByEmail } from "@/db/queries/users";
import { crews, memberships, users } from "@/db/schema";
import { audit } from "@/lib/audit";
import { hashPassword } from "@/lib/auth/password";
import { isDuplicateKey } from "@/lib/db-errors";
import { ConflictError } from "@/lib/errors";
import type { SignUpInput } from "@/lib/validations/auth";

/** Creates the account and a first crew with the new user as its lead. */
export async function signUp(input: SignUpInput, ip?: string): Promise<{ userId: number; crewId: number }> {
  if (await getUserWithSecretByEmail(input.email)) {
    throw new ConflictError("An account with this e-mail already exists; sign in or reset the password");
  }
  const passwordHash = await hashPassword(input.password);
  const result = await db().transaction(async (tx) => {
    const [{ id: userId }] = await tx.insert(users).values({ email: input.email, name: input.name, passwordHash }).$returningId();
    const [{ id: crewId }] = await tx.insert(crews).values({ name: input.crewName }).$returningId();
    await tx.insert(memberships).values({ crewId, userId, role: "lead" });
    return { userId, crewId };
  }).catch((e: unknown) => {
    // Two sign-ups racing for one address: the unique index decides.
    if (isDuplicateKey(e)) throw new ConflictError("An account with this e-mail already exists");
    throw e;
  });
  await audit({ crewId: result.crewId, actorId: result.userId, action: "user.sign-up", targetType: "user", targetId: result.userId, ip });
  return result;
}
