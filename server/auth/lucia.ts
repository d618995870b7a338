// The only file that imports lucia and its adapter: moving to a sessions module of our own later
// (upstream has deprecated the package) stays a change inside server/auth.
import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle';
import { Lucia, TimeSpan, type Session, type User } from 'lucia';
import type { Database } from '../db/client';
import { sessions, users } from '../db/schema';

/** SPEC.md §2: long enough for a race day (and the day before) with no network, sliding. */
export const sessionLifetime = new TimeSpan(3, 'd');
export const sessionCookieName = 'rimelog_session';

export function createLucia(db: Database) {
  return new Lucia(new DrizzlePostgreSQLAdapter(db, sessions, users), {
    sessionExpiresIn: sessionLifetime,
    sessionCookie: { name: sessionCookieName, expires: true, attributes: { sameSite: 'lax', secure: true, path: '/' } },
    getUserAttributes: (attributes) => ({ email: attributes.email, displayName: attributes.displayName }),
    getSessionAttributes: (attributes) => ({ deviceId: attributes.deviceId }),
  });
}

export type Auth = ReturnType<typeof createLucia>;
export type { Session, User };

declare module 'lucia' {
  interface Register {
    Lucia: Auth;
    DatabaseUserAttributes: { email: string; displayName: string };
    DatabaseSessionAttributes: { deviceId: string };
  }
}
