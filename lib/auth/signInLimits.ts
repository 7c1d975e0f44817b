import type { Knex } from "knex";
import { hitLimit, returnHit, SIGN_IN_ACCOUNT_LIMIT, SIGN_IN_ADDRESS_LIMIT, type Limit } from "./rate-limit";

/**
 * Counts a sign-in attempt before the password is checked (admitSignIn): first against the
 * account (whatever address it comes from), then against the client's address. Counting comes
 * first and is atomic, so neither parallel attempts nor a changing X-Forwarded-For get more than
 * the limit through to the password check. A success gives both hits back (signInSucceeded), so
 * the counters hold failures and attempts in flight.
 * @returns the limit that is used up, or null when the attempt may go on.
 */
export async function admitSignIn(db: Knex, email: string, address: string): Promise<Limit | null> {
  if (!(await hitLimit(db, SIGN_IN_ACCOUNT_LIMIT, email)).within) return SIGN_IN_ACCOUNT_LIMIT;
  if (!(await hitLimit(db, SIGN_IN_ADDRESS_LIMIT, address)).within) {
    await returnHit(db, SIGN_IN_ACCOUNT_LIMIT, email);
    return SIGN_IN_ADDRESS_LIMIT;
  }
  return null;
}

/** A sign-in that succeeded: its attempt was no failure. */
export async function signInSucceeded(db: Knex, email: string, address: string): Promise<void> {
  await returnHit(db, SIGN_IN_ACCOUNT_LIMIT, email);
  await returnHit(db, SIGN_IN_ADDRESS_LIMIT, address);
}
