export type MessagePart = { kind: 'text'; text: string } | { kind: 'link'; href: string };

const webAddress = /https?:\/\/[^\s<>"]+/g;

/**
 * A plain-text e-mail body cut into text and web addresses, so invitation and reset links can be
 * opened with one tap, without ever putting mail content into the page as HTML.
 */
export function messageParts(text: string): MessagePart[] {
  const parts: MessagePart[] = [];
  let from = 0;
  for (const match of text.matchAll(webAddress)) {
    // A sentence's full stop or closing bracket after an address is not part of it.
    const href = match[0].replace(/[.,;:!?)\]]+$/, '');
    if (match.index > from) parts.push({ kind: 'text', text: text.slice(from, match.index) });
    parts.push({ kind: 'link', href });
    from = match.index + href.length;
  }
  if (from < text.length) parts.push({ kind: 'text', text: text.slice(from) });
  return parts;
}
