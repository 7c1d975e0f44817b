import bcrypt from "bcryptjs";
import { z } from "zod";

/** Password rule for every account: long rather than complicated. */
export const passwordSchema = z.string().min(10, "Use at least 10 characters.").max(200, "Use at most 200 characters.");

const COST = 11;

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, COST);
}

export function verifyPassword(password: string, hash: string | null): Promise<boolean> {
  // Compare against a dummy hash when there is none, so timing does not reveal which accounts exist.
  return bcrypt.compare(password, hash ?? "$2b$11$C6UzMDM.H6dfI/f/IKxGhuZMzdSxXnlF2/PvU1K0N3Ja5cV8mWbzW");
}
