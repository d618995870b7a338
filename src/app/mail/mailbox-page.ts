import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import type { MailboxMessage } from '../../../shared/mail/mailbox';
import { describeLoadError } from '../core/describe-load-error';
import { mailboxResource } from './mailbox-api';
import { messageParts } from './message-parts';

/** The organisers' mailbox: every e-mail the local mail server kept, newest first, each opened to read. */
@Component({
  selector: 'rl-mailbox-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatButtonModule],
  templateUrl: './mailbox-page.html',
  styleUrl: './mailbox-page.scss',
})
export class MailboxPage {
  protected readonly mailbox = mailboxResource();
  protected readonly messages = computed<MailboxMessage[]>(() =>
    this.mailbox.hasValue()
      ? [...this.mailbox.value().messages].sort((a, b) => Date.parse(b.receivedAt) - Date.parse(a.receivedAt))
      : [],
  );
  private readonly openId = signal<string | null>(null);
  protected readonly opened = computed(() => this.messages().find((message) => message.id === this.openId()) ?? null);
  protected readonly openedParts = computed(() => {
    const message = this.opened();
    return message ? messageParts(message.text) : [];
  });
  protected readonly errorText = computed(() => {
    const error = this.mailbox.error();
    return error ? describeLoadError(error) : undefined;
  });

  protected open(message: MailboxMessage | null): void {
    this.openId.set(message?.id ?? null);
  }
}
