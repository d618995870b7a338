import { httpResource } from '@angular/common/http';
import { mailboxSchema } from '../../../shared/mail/mailbox';

/** What the local fake mail server received (organisers only), checked against the shared schema. */
export function mailboxResource() {
  return httpResource(() => '/api/mailbox', { parse: (raw) => mailboxSchema.parse(raw) });
}
