/** A run of a message's text: words to show as they are, or an address to show as a link. */
export type TextPart =
  | { readonly kind: 'text'; readonly text: string }
  | { readonly kind: 'link'; readonly text: string; readonly href: string };

/** Web addresses in plain text; only http and https, so that no other scheme becomes clickable. */
const ADDRESS = /\bhttps?:\/\/[^\s<>"]+/gi;

/** Punctuation that ends a sentence more often than it ends an address ("…here: https://x/y."). */
const TRAILING = /[.,;:!?'")\]]+$/;

/** Splits an e-mail's plain text into text and links, keeping every character of it. */
export function linkify(text: string): TextPart[] {
  const parts: TextPart[] = [];
  let last = 0;
  for (const match of text.matchAll(ADDRESS)) {
    const start = match.index;
    const address = match[0].replace(TRAILING, '');
    if (start > last) parts.push({ kind: 'text', text: text.slice(last, start) });
    parts.push({ kind: 'link', text: address, href: address });
    last = start + address.length;
  }
  if (last < text.length) parts.push({ kind: 'text', text: text.slice(last) });
  return parts;
}

/**
 * The path of an address of this very app (`/accept-invitation?token=…`), so that following it stays in
 * the page instead of reloading it; null for an address elsewhere.
 */
export function pathInApp(href: string, origin: string): string | null {
  try {
    const url = new URL(href);
    return url.origin === origin ? `${url.pathname}${url.search}${url.hash}` : null;
  } catch {
    return null;
  }
}
