import { RateLimiterMemory, RateLimiterRes } from 'rate-limiter-flexible';
import { ApiError } from '../http/api-error';

export interface PasswordResetLimitOptions {
  /** Requests per e-mail address in the window, whether or not it has an account. */
  perEmail: number;
  /** Requests per network address in the window: a hut shares one address, so more. */
  perAddress: number;
  windowSeconds: number;
}

export const defaultPasswordResetLimits: PasswordResetLimitOptions = { perEmail: 3, perAddress: 30, windowSeconds: 60 * 60 };

/**
 * Counts password reset requests, so nobody can fill a mailbox with reset mail. Kept apart from the
 * sign-in limits: asking for a reset is not a failed sign-in and must not lock the hut's address out.
 */
export function createPasswordResetLimits(options: PasswordResetLimitOptions = defaultPasswordResetLimits) {
  const byEmail = new RateLimiterMemory({ points: options.perEmail, duration: options.windowSeconds, keyPrefix: 'reset-email' });
  const byAddress = new RateLimiterMemory({ points: options.perAddress, duration: options.windowSeconds, keyPrefix: 'reset-address' });

  return {
    /** Counts one request, or throws a 429 that reads the same whether or not the account exists. */
    async consume(email: string, address: string): Promise<void> {
      const results = await Promise.allSettled([byEmail.consume(email), byAddress.consume(address)]);
      const refusals = results.flatMap((result) => (result.status === 'rejected' ? [result.reason as unknown] : []));
      if (refusals.length === 0) return;
      const waitMs = Math.max(
        ...refusals.map((reason) => {
          if (reason instanceof RateLimiterRes) return reason.msBeforeNext;
          throw reason;
        }),
      );
      throw new ApiError(
        'too_many_requests',
        `Too many password reset requests. Wait ${Math.max(1, Math.ceil(waitMs / 60_000))} min; a link already sent still works for its hour.`,
      );
    },
  };
}

export type PasswordResetLimits = ReturnType<typeof createPasswordResetLimits>;
