import bcrypt from "bcryptjs";

// Cost 11 ≈ 0.15 s in pure JS on this class of machine: slow for guessing, fine for a sign-in.
const COST = 11;

export function hashPassword(plain: string): Promise<string> {
  return bcrypt.hash(plain, COST);
}

export function verifyPassword(plain: string, hash: string): Promise<boolean> {
  return bcrypt.compare(plain, hash);
}

/** Spent on unknown e-mails too, so response time does not reveal which accounts exist. */
const DUMMY_HASH = "$2b$11$C6UzMDM.H6dfI/f/IKcEeO8n6lQ1/6WcD0bHfTsymrQKhAsk2ZkT2";
export async function burnPasswordCheck(plain: string): Promise<void> {
  await bcrypt.compare(plain, DUMMY_HASH);
}
