import "server-only";
import { sql } from "drizzle-orm";
import { RateLimiterDrizzle, RateLimiterRes } from "rate-limiter-flexible";
import type { Db, Tx } from "@/db/client";
import { getDb } from "@/db/client";
import { rateLimits } from "@/db/schema";
import { signInSchema } from "./sign-in";
import { clientAddress } from "./client-address";

/**
 * Sign-in tries for one account from one client address: 5 in 15 minutes, then that pair is refused for
 * 15 minutes (common practice for password guessing: a handful of tries, then a pause). A digger who
 * mistypes twice is untouched, and the owner signing in from another device is not slowed at all.
 */
export const PAIR_LIMIT = { points: 5, duration: 15 * 60, blockDuration: 15 * 60 };
/** Tries for one account from anywhere: a ceiling far above any person's, against guessing from many addresses. */
export const ACCOUNT_LIMIT = { points: 100, duration: 60 * 60 };

const PAIR_PREFIX = "sign-in-pair";
const ACCOUNT_PREFIX = "sign-in-account";

type Limiters = { pair: RateLimiterDrizzle; account: RateLimiterDrizzle };
const byDb = new WeakMap<object, Limiters>();

function limiters(db: Db): Limiters {
  let found = byDb.get(db);
  if (!found) {
    found = {
      pair: new RateLimiterDrizzle({ storeClient: db, schema: rateLimits, keyPrefix: PAIR_PREFIX, ...PAIR_LIMIT }),
      account: new RateLimiterDrizzle({
        storeClient: db,
        schema: rateLimits,
        keyPrefix: ACCOUNT_PREFIX,
        ...ACCOUNT_LIMIT,
      }),
    };
    byDb.set(db, found);
  }
  return found;
}

/** An e-mail has no spaces, so "e-mail address" keys of one account share the prefix "e-mail ". */
const pairKey = (email: string, address: string) => `${email} ${address}`;

export type SignInRefusal = { retryAfterSeconds: number; message: string };

const refusal = (res: RateLimiterRes): SignInRefusal => {
  const seconds = Math.max(1, Math.ceil(res.msBeforeNext / 1000));
  const minutes = Math.ceil(seconds / 60);
  return {
    retryAfterSeconds: seconds,
    message: `Too many sign-in tries for this account from here. Try again in ${minutes} minute${minutes === 1 ? "" : "s"}, or reset your password.`,
  };
};

/**
 * Counts one sign-in try before the password is checked, so tries sent at once are all counted; null when it
 * may go ahead, else how long to wait. A refused try is not counted against the account's ceiling.
 */
export async function admitSignIn(rawEmail: unknown, headers: Headers): Promise<SignInRefusal | null> {
  const parsed = signInSchema.shape.email.safeParse(rawEmail);
  // An address that is not an e-mail is refused before any password is checked; nothing to count.
  if (!parsed.success) return null;
  const { pair, account } = limiters(await getDb());
  try {
    await pair.consume(pairKey(parsed.data, clientAddress(headers)));
    await account.consume(parsed.data);
    return null;
  } catch (err) {
    if (err instanceof RateLimiterRes) return refusal(err);
    throw err;
  }
}

/**
 * After a right password: this address's tries for the account start again, and the try is given back to the
 * account's ceiling, so that only wrong guesses fill it however often the owner signs in.
 */
export async function forgetSignInTries(email: string, headers: Headers): Promise<void> {
  const { pair, account } = limiters(await getDb());
  await pair.delete(pairKey(email, clientAddress(headers)));
  await account.reward(email, 1);
}

/** After a password reset: every count for the account is cleared, so its owner can sign in at once. */
export async function clearSignInLimits(db: Db | Tx, email: string): Promise<void> {
  await db
    .delete(rateLimits)
    .where(
      sql`starts_with(${rateLimits.key}, ${`${PAIR_PREFIX}:${email} `}) or ${rateLimits.key} = ${`${ACCOUNT_PREFIX}:${email}`}`,
    );
}
