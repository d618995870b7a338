import { messageParts } from './message-parts';

describe('messageParts', () => {
  it('when a message holds a link, then the link is cut out without the full stop after it', () => {
    expect(messageParts('Open http://127.0.0.1:4310/accept-invitation?token=abc_123. Thanks')).toEqual([
      { kind: 'text', text: 'Open ' },
      { kind: 'link', href: 'http://127.0.0.1:4310/accept-invitation?token=abc_123' },
      { kind: 'text', text: '. Thanks' },
    ]);
  });

  it('when a message has no web address, then it is one text part, markup and all', () => {
    expect(messageParts('<b>not html</b> javascript:alert(1)')).toEqual([{ kind: 'text', text: '<b>not html</b> javascript:alert(1)' }]);
  });
});
