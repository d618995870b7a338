import { and, eq, gt, isNull } from 'drizzle-orm';
import { passwordResetConfirmSchema, passwordResetRequestSchema } from '../../shared/auth/auth-api';
import { publicAccess } from '../auth/access';
import type { Auth } from '../auth/lucia';
import { hashToken, newOneTimeToken } from '../auth/one-time-tokens';
import { hashSecret } from '../auth/passwords';
import type { SignInLimits } from '../auth/sign-in-limits';
import type { Database } from '../db/client';
import { devicePins, passwordResets, users } from '../db/schema';
import { ApiError } from '../http/api-error';
import type { ApiRoute } from '../http/api-route';
import { parseInput } from '../http/parse-input';
import type { Mailer } from '../mail/mailer';
import { passwordResetLink } from './links';
import type { PasswordResetLimits } from './reset-limits';

export interface PasswordResetRouteDeps {
  db: Database;
  auth: Auth;
  limits: SignInLimits;
  mailer: Mailer;
  publicUrl: string;
  resetLimits: PasswordResetLimits;
}

export const passwordResetLifetimeMs = 60 * 60 * 1000;

/** The same words whether or not the address has an account. */
export const passwordResetAnswer = {
  message: 'If there is a Rimelog account for this address, a link to choose a new password is on its way. It works for one hour.',
};

export const resetLinkNotValid = () =>
  new ApiError(
    'bad_request',
    'This password reset link does not work any more: it was already used, it has run out, or it was not copied whole. Ask for a new link on the sign-in page.',
    [{ field: 'token', message: 'ask for a new password reset link' }],
  );

const stillValid = (tokenHash: string) =>
  and(eq(passwordResets.tokenHash, tokenHash), isNull(passwordResets.usedAt), gt(passwordResets.expiresAt, new Date()));

export function passwordResetRoutes({ db, auth, limits, mailer, publicUrl, resetLimits }: PasswordResetRouteDeps): ApiRoute[] {
  return [
    {
      method: 'post',
      path: '/auth/password-reset',
      access: publicAccess,
      handle: async (req, res) => {
        const input = parseInput(passwordResetRequestSchema, req.body, 'body');
        await resetLimits.consume(input.email, req.ip ?? 'unknown');
        const [user] = await db
          .select({ id: users.id, displayName: users.displayName })
          .from(users)
          .where(eq(users.email, input.email));
        if (user) {
          const { token, tokenHash } = newOneTimeToken();
          const expiresAt = new Date(Date.now() + passwordResetLifetimeMs);
          await db.insert(passwordResets).values({ tokenHash, userId: user.id, expiresAt });
          // Not awaited: waiting for the mail server would make the answer slower for real accounts.
          mailer
            .sendPasswordReset(input.email, { displayName: user.displayName, link: passwordResetLink(publicUrl, token) })
            .catch((error: unknown) => req.log.error({ err: error }, 'a password reset mail could not be sent'));
        }
        res.status(202).json(passwordResetAnswer);
      },
    },
    {
      method: 'post',
      path: '/auth/password-reset/confirm',
      access: publicAccess,
      handle: async (req, res) => {
        const input = parseInput(passwordResetConfirmSchema, req.body, 'body');
        const tokenHash = hashToken(input.token);
        const [reset] = await db.select({ userId: passwordResets.userId }).from(passwordResets).where(stillValid(tokenHash));
        if (!reset) throw resetLinkNotValid();
        const passwordHash = await hashSecret(input.password);
        const changed = await db.transaction(async (tx) => {
          const now = new Date();
          const [claimed] = await tx.update(passwordResets).set({ usedAt: now }).where(stillValid(tokenHash)).returning();
          if (!claimed) return undefined;
          const [user] = await tx
            .update(users)
            .set({ passwordHash })
            .where(eq(users.id, claimed.userId))
            .returning({ id: users.id, email: users.email });
          await tx.delete(devicePins).where(eq(devicePins.userId, claimed.userId));
          // Other reset links still sitting in the mailbox die with this one.
          await tx
            .update(passwordResets)
            .set({ usedAt: now })
            .where(and(eq(passwordResets.userId, claimed.userId), isNull(passwordResets.usedAt)));
          return user;
        });
        if (!changed) throw resetLinkNotValid();
        await auth.invalidateUserSessions(changed.id);
        // The link proved the mailbox is theirs: failed sign-ins before the reset no longer lock them out.
        await limits.recordSuccess(changed.email);
        res.status(204).end();
      },
    },
  ];
}
