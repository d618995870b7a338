import { randomUUID } from 'node:crypto';
import type { Express } from 'express';
import request from 'supertest';
import { demoPassword } from '../../server/ops/demo-users';

/** Requests from the app itself carry an Origin naming the server; tests name both explicitly. */
export const sameOrigin = { Host: 'rimelog.test', Origin: 'http://rimelog.test' } as const;

/** The `name=value` part of the session cookie the server set, ready for a Cookie header. */
export function sessionCookieFrom(setCookie: string | string[] | undefined): string {
  const cookies = Array.isArray(setCookie) ? setCookie : setCookie ? [setCookie] : [];
  const session = cookies.find((c) => c.startsWith('rimelog_session=') && !c.startsWith('rimelog_session=;'));
  if (!session) throw new Error(`No session cookie was set (got ${JSON.stringify(cookies)}).`);
  return session.split(';')[0]!;
}

/** Signs a demo user in through the real route and returns the Cookie header value. */
export async function signInAs(app: Express, email: string, options: { password?: string; deviceId?: string } = {}): Promise<string> {
  const response = await request(app)
    .post('/api/auth/sign-in')
    .set(sameOrigin)
    .send({ email, password: options.password ?? demoPassword, deviceId: options.deviceId ?? randomUUID() })
    .expect(200);
  return sessionCookieFrom(response.headers['set-cookie']);
}
