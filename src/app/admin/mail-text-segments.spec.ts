import { describe, expect, it } from 'vitest';
import { mailTextSegments } from './mail-text-segments';

describe('mailTextSegments', () => {
  it('when a message holds links, then they become link segments and the rest stays text, in order', () => {
    const text = 'Accept here:\nhttp://127.0.0.1:4300/invitations/a-b_c\n\nor ignore.';
    expect(mailTextSegments(text)).toEqual([
      { text: 'Accept here:\n' },
      { text: 'http://127.0.0.1:4300/invitations/a-b_c', href: 'http://127.0.0.1:4300/invitations/a-b_c' },
      { text: '\n\nor ignore.' },
    ]);
    expect(mailTextSegments(text).map((s) => s.text).join('')).toBe(text);
  });

  it('when there is no link, then the text is one segment', () => {
    expect(mailTextSegments('plain words')).toEqual([{ text: 'plain words' }]);
  });
});
