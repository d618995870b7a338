import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { Mailbox } from '../../../shared/mail/mailbox';
import { MailboxPage } from './mailbox-page';

const mailbox: Mailbox = {
  messages: [
    {
      id: '0193a5c0-0000-7000-8000-00000000e001',
      receivedAt: '2027-01-08T09:00:00.000Z',
      from: 'Rimelog <rimelog@example.test>',
      to: ['first.official@example.test'],
      subject: 'You are invited to Rimelog',
      text: 'Choose your password here: http://127.0.0.1:4310/accept-invitation?token=first-token-0123456789.\nSee you at the start.',
    },
    {
      id: '0193a5c0-0000-7000-8000-00000000e002',
      receivedAt: '2027-01-08T11:30:00.000Z',
      from: 'Rimelog <rimelog@example.test>',
      to: ['second.official@example.test'],
      subject: 'Choose a new Rimelog password',
      text: 'Reset link: http://127.0.0.1:4310/reset-password?token=second-token-0123456789',
    },
  ],
};

function setUp() {
  TestBed.configureTestingModule({
    providers: [provideZonelessChangeDetection(), provideHttpClient(), provideHttpClientTesting(), provideRouter([])],
  });
  const fixture = TestBed.createComponent(MailboxPage);
  TestBed.tick();
  return { fixture, http: TestBed.inject(HttpTestingController), element: fixture.nativeElement as HTMLElement };
}

describe('MailboxPage', () => {
  afterEach(() => TestBed.inject(HttpTestingController).verify());

  it('when the organiser opens the mailbox, then the messages are listed newest first', async () => {
    const { fixture, http, element } = setUp();
    http.expectOne('/api/mailbox').flush(mailbox);
    await fixture.whenStable();

    const subjects = [...element.querySelectorAll('.message-item .subject')].map((s) => s.textContent?.trim());
    expect(subjects).toEqual(['Choose a new Rimelog password', 'You are invited to Rimelog']);
    expect(element.querySelector('.message-item .meta')?.textContent).toContain('To second.official@example.test');
  });

  it('when a message is opened, then its whole text shows with its link ready to tap, and Back returns', async () => {
    const { fixture, http, element } = setUp();
    http.expectOne('/api/mailbox').flush(mailbox);
    await fixture.whenStable();

    const invitation = [...element.querySelectorAll<HTMLButtonElement>('.message-item')].find((b) => b.textContent?.includes('invited'))!;
    invitation.click();
    await fixture.whenStable();

    expect(element.querySelector('h2')?.textContent).toBe('You are invited to Rimelog');
    expect(element.querySelector('.headers')?.textContent).toContain('first.official@example.test');
    const body = element.querySelector('.body')!;
    expect(body.textContent).toBe(mailbox.messages[0]!.text);
    expect(body.querySelector('a')?.getAttribute('href')).toBe('http://127.0.0.1:4310/accept-invitation?token=first-token-0123456789');

    (element.querySelector('button.primary-action') as HTMLButtonElement).click();
    await fixture.whenStable();
    expect(element.querySelectorAll('.message-item')).toHaveLength(2);
  });

  it('when the server refuses (not an organiser), then its words are shown', async () => {
    const { fixture, http, element } = setUp();
    http
      .expectOne('/api/mailbox')
      .flush(
        { error: { code: 'forbidden', message: 'Your role in this competition does not allow this.', details: [] } },
        { status: 403, statusText: 'Forbidden' },
      );
    await fixture.whenStable();
    expect(element.querySelector('[role="alert"]')?.textContent).toContain('does not allow this');
  });

  it('when no mail has come yet, then it says what will arrive here', async () => {
    const { fixture, http, element } = setUp();
    http.expectOne('/api/mailbox').flush({ messages: [] });
    await fixture.whenStable();
    expect(element.textContent).toContain('No e-mails yet.');
  });
});
