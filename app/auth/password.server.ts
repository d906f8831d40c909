import bcrypt from "bcryptjs";
import { z } from "zod";

/** bcrypt work factor; 10 is the floor the product promises. */
export const BCRYPT_COST = 10;

export const passwordSchema = z
  .string({ error: "Choose a password" })
  .min(10, "Use at least 10 characters")
  .max(128, "Use at most 128 characters");

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, BCRYPT_COST);
}

export function verifyPassword(password: string, hash: string): Promise<boolean> {
  return bcrypt.compare(password, hash);
}

// A fixed hash to compare against when the e-mail is unknown, so a wrong
// address takes as long to refuse as a wrong password.
let decoy: string | undefined;
export async function spendPasswordCheck(password: string) {
  decoy ??= await bcrypt.hash("nearnote-decoy-password", BCRYPT_COST);
  await bcrypt.compare(password, decoy);
}
