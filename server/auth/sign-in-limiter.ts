import type pg from "pg";
import { RateLimiterPostgres, RateLimiterRes } from "rate-limiter-flexible";

import { AppError } from "../lib/app-error";

export interface SignInLimits {
  perAccount: number;
  perAddress: number;
  windowMinutes: number;
}

export type SignInLimiter = ReturnType<typeof createSignInLimiter>;

/** Where a password is being tried: both guess the same secret, so they share one budget. */
export type PasswordAttempt = "sign-in" | "password-change";

/**
 * Counts failed password attempts (sign-in, and the current password when changing it) per
 * account and per client address in PostgreSQL, so every app process behind a load balancer
 * shares the same counters. Past either limit, the attempt answers 429 until the window ends,
 * even with the right password.
 */
export function createSignInLimiter(pool: pg.Pool, limits: SignInLimits) {
  const duration = limits.windowMinutes * 60;
  const common = {
    storeClient: pool,
    storeType: "pool",
    tableName: "rate_limits",
    tableCreated: true,
    duration,
    clearExpiredByTimeout: false,
  };
  const byAccount = new RateLimiterPostgres({
    ...common,
    keyPrefix: "sign-in:account",
    points: limits.perAccount,
  });
  const byAddress = new RateLimiterPostgres({
    ...common,
    keyPrefix: "sign-in:address",
    points: limits.perAddress,
  });

  const blocked = (res: RateLimiterRes | null, points: number) =>
    res !== null && res.consumedPoints >= points ? Math.ceil(res.msBeforeNext / 1000) : 0;

  const tooMany = (seconds: number, attempt: PasswordAttempt) => {
    const minutes = `${Math.max(1, Math.ceil(seconds / 60))} minute(s)`;
    return new AppError(
      "rate_limited",
      429,
      attempt === "sign-in"
        ? `Too many failed sign-ins. Try again in ${minutes}.`
        : `Too many wrong passwords. For your safety, try again in ${minutes}.`,
      { retryAfterSeconds: seconds },
    );
  };

  return {
    async assertAllowed(
      email: string,
      address: string,
      attempt: PasswordAttempt = "sign-in",
    ): Promise<void> {
      const [account, client] = await Promise.all([byAccount.get(email), byAddress.get(address)]);
      const wait = Math.max(
        blocked(account, limits.perAccount),
        blocked(client, limits.perAddress),
      );
      if (wait > 0) throw tooMany(wait, attempt);
    },

    async recordFailure(email: string, address: string): Promise<void> {
      await Promise.all([byAccount.penalty(email, 1), byAddress.penalty(address, 1)]);
    },

    async recordSuccess(email: string): Promise<void> {
      await byAccount.delete(email);
    },
  };
}

export type ResetLimiter = ReturnType<typeof createResetLimiter>;

/**
 * Password-reset e-mails per address and per client, so the form cannot be used to flood a
 * mailbox. Past the limit the answer stays the same; no e-mail is queued.
 */
export function createResetLimiter(
  pool: pg.Pool,
  limits: { perAccount: number; perAddress: number; windowMinutes: number },
) {
  const common = {
    storeClient: pool,
    storeType: "pool",
    tableName: "rate_limits",
    tableCreated: true,
    duration: limits.windowMinutes * 60,
    clearExpiredByTimeout: false,
  };
  const byAccount = new RateLimiterPostgres({
    ...common,
    keyPrefix: "reset:account",
    points: limits.perAccount,
  });
  const byAddress = new RateLimiterPostgres({
    ...common,
    keyPrefix: "reset:address",
    points: limits.perAddress,
  });
  return {
    async allow(email: string, address: string): Promise<boolean> {
      try {
        await Promise.all([byAccount.consume(email), byAddress.consume(address)]);
        return true;
      } catch (error) {
        if (error instanceof RateLimiterRes) return false;
        throw error;
      }
    },
  };
}
