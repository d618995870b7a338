import { desc } from 'drizzle-orm';
import { mailboxSchema } from '../../shared/mail/mailbox';
import { anyRole } from '../auth/access';
import type { Database } from '../db/client';
import { fakeMailMessages } from '../db/schema';
import type { ApiRoute } from '../http/api-route';

const newestKept = 200;

/** What the local fake mail server received, for organisers (empty when SMTP_URL sends real mail). */
export function mailboxRoutes(db: Database): ApiRoute[] {
  return [
    {
      method: 'get',
      path: '/mailbox',
      access: anyRole(['organiser']),
      handle: async (_req, res) => {
        const rows = await db
          .select()
          .from(fakeMailMessages)
          .orderBy(desc(fakeMailMessages.receivedAt), desc(fakeMailMessages.id))
          .limit(newestKept);
        res.json(mailboxSchema.parse({ messages: rows.map((row) => ({ ...row, receivedAt: row.receivedAt.toISOString() })) }));
      },
    },
  ];
}
