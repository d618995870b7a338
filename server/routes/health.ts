import { sql } from 'drizzle-orm';
import { publicAccess } from '../auth/access';
import type { Database } from '../db/client';
import { ApiError } from '../http/api-error';
import type { ApiRoute } from '../http/api-route';

/** `GET /api/health`: the device's heartbeat; answers 503 when the database cannot be reached. */
export function healthRoutes(db: Database): ApiRoute[] {
  return [
    {
      method: 'get',
      path: '/health',
      access: publicAccess,
      handle: async (_req, res) => {
        try {
          await db.execute(sql`select 1`);
        } catch {
          // Any failure to reach PostgreSQL means the server cannot take records right now.
          throw new ApiError('unavailable', 'The server is up but its database is not reachable. Try again shortly.');
        }
        res.json({ status: 'ok', serverTime: new Date().toISOString() });
      },
    },
  ];
}
