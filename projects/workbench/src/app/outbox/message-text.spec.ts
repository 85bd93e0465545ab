import { describe, expect, it } from 'vitest';
import { MASKED_SECRET as API_MASKED_SECRET } from '@counterpoise/api';
import { hasMaskedSecret, linkify, MASKED_SECRET, pathInApp } from './message-text';

describe('linkify', () => {
  it('turns web addresses into links and keeps every other character', () => {
    const text = 'Hello,\n\nJoin here: https://shop.example.com/accept-invitation?token=abc_123.\nSee you.';
    const parts = linkify(text);
    expect(parts).toEqual([
      { kind: 'text', text: 'Hello,\n\nJoin here: ' },
      {
        kind: 'link',
        text: 'https://shop.example.com/accept-invitation?token=abc_123',
        href: 'https://shop.example.com/accept-invitation?token=abc_123',
      },
      { kind: 'text', text: '.\nSee you.' },
    ]);
    expect(parts.map((part) => part.text).join('')).toBe(text);
  });

  it('leaves other schemes as text, so that nothing but a web page opens', () => {
    expect(linkify('javascript:alert(1) and mailto:owner@example.com')).toEqual([
      { kind: 'text', text: 'javascript:alert(1) and mailto:owner@example.com' },
    ]);
  });

  it('finds several links, and none in an empty text', () => {
    expect(
      linkify('http://a.example.com (or http://b.example.com)').filter((p) => p.kind === 'link'),
    ).toHaveLength(2);
    expect(linkify('')).toEqual([]);
  });
});

describe('masked links', () => {
  it('uses the mark the server writes in place of a secret', () => {
    expect(MASKED_SECRET).toBe(API_MASKED_SECRET);
  });

  it('leaves an address whose secret is masked as text, and finds the mark', () => {
    const text = `Accept: http://localhost:4300/accept-invitation?token=${MASKED_SECRET}\nThen sign in.`;
    expect(linkify(text)).toEqual([{ kind: 'text', text }]);
    expect(hasMaskedSecret(text)).toBe(true);
    expect(hasMaskedSecret('See https://docs.example.com/guide')).toBe(false);
  });
});

describe('pathInApp', () => {
  it('gives the path of an address of this app, and null for any other', () => {
    expect(pathInApp('http://localhost:4300/reset-password?token=x#top', 'http://localhost:4300')).toBe(
      '/reset-password?token=x#top',
    );
    expect(pathInApp('https://elsewhere.example.com/reset-password', 'http://localhost:4300')).toBeNull();
    expect(pathInApp('not an address', 'http://localhost:4300')).toBeNull();
  });
});
