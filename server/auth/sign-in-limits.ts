import { RateLimiterMemory, type RateLimiterRes } from 'rate-limiter-flexible';
import { ApiError } from '../http/api-error';

export interface SignInLimitOptions {
  /** Failed attempts per account in the window (SPEC.md §4). */
  perAccount: number;
  /** Failed attempts per network address in the window: a hut shares one address, so more. */
  perAddress: number;
  windowSeconds: number;
}

export const defaultSignInLimits: SignInLimitOptions = { perAccount: 5, perAddress: 50, windowSeconds: 15 * 60 };

/** Counts failed sign-ins and PIN switches per account and per address; a success clears the account. */
export function createSignInLimits(options: SignInLimitOptions = defaultSignInLimits) {
  const byAccount = new RateLimiterMemory({ points: options.perAccount, duration: options.windowSeconds, keyPrefix: 'account' });
  const byAddress = new RateLimiterMemory({ points: options.perAddress, duration: options.windowSeconds, keyPrefix: 'address' });

  const blockedFor = (result: RateLimiterRes | null, limit: number) =>
    result && result.consumedPoints >= limit ? Math.ceil(result.msBeforeNext / 60_000) : 0;

  return {
    async assertAllowed(account: string, address: string): Promise<void> {
      const minutes = Math.max(
        blockedFor(await byAccount.get(account), options.perAccount),
        blockedFor(await byAddress.get(address), options.perAddress),
      );
      if (minutes > 0) {
        throw new ApiError(
          'too_many_requests',
          `Too many failed attempts. Wait ${minutes} min and try again, or ask the area leader to reset your password.`,
        );
      }
    },
    async recordFailure(account: string, address: string): Promise<void> {
      // consume() rejects once the limit is passed; the count is what matters here.
      await Promise.allSettled([byAccount.consume(account), byAddress.consume(address)]);
    },
    async recordSuccess(account: string): Promise<void> {
      await byAccount.delete(account);
    },
  };
}

export type SignInLimits = ReturnType<typeof createSignInLimits>;
