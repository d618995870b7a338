import { and, eq } from 'drizzle-orm';
import type { Request } from 'express';
import { meSchema, setPinRequestSchema, signInRequestSchema, switchRequestSchema, type Me } from '../../shared/auth/auth-api';
import type { Database } from '../db/client';
import { devicePins, users } from '../db/schema';
import { ApiError } from '../http/api-error';
import type { ApiRoute } from '../http/api-route';
import { parseInput } from '../http/parse-input';
import { publicAccess, signedIn } from './access';
import type { Auth } from './lucia';
import { hashSecret, verifyAgainstDecoy, verifySecret } from './passwords';
import { clearSessionCookie, requireAuth, setSessionCookie, type RequestAuth } from './request-auth';
import { loadRoles } from './role-store';
import type { SignInLimits } from './sign-in-limits';

export interface AuthRouteDeps {
  db: Database;
  auth: Auth;
  limits: SignInLimits;
}

const address = (req: Request) => req.ip ?? 'unknown';
const wrongSignIn = () => new ApiError('unauthenticated', 'The e-mail address or the password is not right.');
const wrongPin = () => new ApiError('unauthenticated', 'That PIN is not right for this official on this device.');

async function describeMe(db: Database, { user, session, roles }: RequestAuth): Promise<Me> {
  const [pin] = await db
    .select({ userId: devicePins.userId })
    .from(devicePins)
    .where(and(eq(devicePins.userId, user.id), eq(devicePins.deviceId, session.deviceId)));
  return meSchema.parse({
    user: { id: user.id, email: user.email, displayName: user.displayName },
    roles,
    deviceId: session.deviceId,
    sessionExpiresAt: session.expiresAt.toISOString(),
    hasPin: pin !== undefined,
  });
}

/** Starts a session for the user on the device, sets its cookie and answers who is now signed in. */
async function startSession(deps: AuthRouteDeps, res: Parameters<ApiRoute['handle']>[1], userId: string, deviceId: string): Promise<Me> {
  const session = await deps.auth.createSession(userId, { deviceId });
  setSessionCookie(deps.auth, res, session.id);
  const { user } = await deps.auth.validateSession(session.id);
  if (!user) throw new Error('A session just created could not be read back.');
  return describeMe(deps.db, { user, session, roles: await loadRoles(deps.db, userId) });
}

export function authRoutes(deps: AuthRouteDeps): ApiRoute[] {
  const { db, auth, limits } = deps;
  return [
    {
      method: 'post',
      path: '/auth/sign-in',
      access: publicAccess,
      handle: async (req, res) => {
        const input = parseInput(signInRequestSchema, req.body, 'body');
        await limits.assertAllowed(input.email, address(req));
        const [user] = await db.select().from(users).where(eq(users.email, input.email));
        const ok = user ? await verifySecret(user.passwordHash, input.password) : await verifyAgainstDecoy(input.password);
        if (!user || !ok) {
          await limits.recordFailure(input.email, address(req));
          throw wrongSignIn();
        }
        await limits.recordSuccess(input.email);
        res.json(await startSession(deps, res, user.id, input.deviceId));
      },
    },
    {
      method: 'get',
      path: '/auth/me',
      access: signedIn,
      handle: async (_req, res) => {
        res.json(await describeMe(db, requireAuth(res)));
      },
    },
    {
      method: 'post',
      path: '/auth/sign-out',
      access: signedIn,
      handle: async (_req, res) => {
        await auth.invalidateSession(requireAuth(res).session.id);
        clearSessionCookie(auth, res);
        res.status(204).end();
      },
    },
    {
      method: 'post',
      path: '/auth/sign-out-everywhere',
      access: signedIn,
      handle: async (_req, res) => {
        const { user } = requireAuth(res);
        await auth.invalidateUserSessions(user.id);
        await db.delete(devicePins).where(eq(devicePins.userId, user.id));
        clearSessionCookie(auth, res);
        res.status(204).end();
      },
    },
    {
      method: 'post',
      path: '/auth/pin',
      access: signedIn,
      handle: async (req, res) => {
        const { user, session } = requireAuth(res);
        const input = parseInput(setPinRequestSchema, req.body, 'body');
        await limits.assertAllowed(user.email, address(req));
        const [row] = await db.select({ passwordHash: users.passwordHash }).from(users).where(eq(users.id, user.id));
        if (!row || !(await verifySecret(row.passwordHash, input.password))) {
          await limits.recordFailure(user.email, address(req));
          throw new ApiError('unauthenticated', 'The password is not right, so the PIN was not set.');
        }
        const pinHash = await hashSecret(input.pin);
        await db
          .insert(devicePins)
          .values({ userId: user.id, deviceId: session.deviceId, pinHash })
          .onConflictDoUpdate({ target: [devicePins.userId, devicePins.deviceId], set: { pinHash, setAt: new Date() } });
        res.status(204).end();
      },
    },
    {
      method: 'get',
      path: '/auth/device-users',
      access: signedIn,
      handle: async (_req, res) => {
        const { session } = requireAuth(res);
        const rows = await db
          .select({ id: users.id, displayName: users.displayName })
          .from(devicePins)
          .innerJoin(users, eq(users.id, devicePins.userId))
          .where(eq(devicePins.deviceId, session.deviceId))
          .orderBy(users.displayName);
        res.json({ users: rows });
      },
    },
    {
      method: 'post',
      path: '/auth/switch',
      access: signedIn,
      handle: async (req, res) => {
        const { session } = requireAuth(res);
        const input = parseInput(switchRequestSchema, req.body, 'body');
        const key = `pin:${input.userId}:${session.deviceId}`;
        await limits.assertAllowed(key, address(req));
        const [pin] = await db
          .select({ pinHash: devicePins.pinHash })
          .from(devicePins)
          .where(and(eq(devicePins.userId, input.userId), eq(devicePins.deviceId, session.deviceId)));
        const ok = pin ? await verifySecret(pin.pinHash, input.pin) : await verifyAgainstDecoy(input.pin);
        if (!pin || !ok) {
          await limits.recordFailure(key, address(req));
          throw wrongPin();
        }
        await limits.recordSuccess(key);
        res.json(await startSession(deps, res, input.userId, session.deviceId));
      },
    },
  ];
}
