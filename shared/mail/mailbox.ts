import { z } from 'zod';

/** `GET /api/mailbox` (organisers): what the local fake mail server received, newest first. */
export const mailboxMessageSchema = z.object({
  id: z.uuid(),
  receivedAt: z.iso.datetime({ offset: true }),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
});
export type MailboxMessage = z.infer<typeof mailboxMessageSchema>;

export const mailboxSchema = z.object({ messages: z.array(mailboxMessageSchema) });
export type Mailbox = z.infer<typeof mailboxSchema>;
