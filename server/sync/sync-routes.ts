import { pullQuerySchema, pushRequestSchema, type PushResponse } from '../../shared/sync/sync-api';
import { signedIn } from '../auth/access';
import { requireAuth } from '../auth/request-auth';
import type { Database } from '../db/client';
import { ApiError } from '../http/api-error';
import type { ApiRoute } from '../http/api-route';
import { parseInput } from '../http/parse-input';
import { pullChanges } from './pull-changes';
import { pushOps } from './push-ops';

/** `POST /api/sync/push` and `GET /api/sync/pull`: each op is authorised on its own (SPEC.md §6). */
export function syncRoutes(db: Database): ApiRoute[] {
  return [
    {
      method: 'post',
      path: '/sync/push',
      access: signedIn,
      handle: async (req, res) => {
        const { user, session, roles } = requireAuth(res);
        const { ops } = parseInput(pushRequestSchema, req.body, 'body');
        let results;
        try {
          results = await pushOps(db, { userId: user.id, deviceId: session.deviceId, roles }, ops);
        } catch (error) {
          // SPEC.md §3: nothing of the batch was saved; the device sends the same ops again.
          req.log.warn({ err: error }, 'sync push failed; batch rolled back');
          throw new ApiError('unavailable', 'The server could not save this batch just now; nothing of it was saved. The device will send it again.');
        }
        const body: PushResponse = { results, serverTime: new Date().toISOString() };
        res.json(body);
      },
    },
    {
      method: 'get',
      path: '/sync/pull',
      access: signedIn,
      handle: async (req, res) => {
        const { roles } = requireAuth(res);
        const { after, limit } = parseInput(pullQuerySchema, req.query, 'query');
        res.json(await pullChanges(db, roles, after, limit));
      },
    },
  ];
}
