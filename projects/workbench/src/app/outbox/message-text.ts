/** A run of a message's text: words to show as they are, or an address to show as a link. */
export type TextPart =
  | { readonly kind: 'text'; readonly text: string }
  | { readonly kind: 'link'; readonly text: string; readonly href: string };

/**
 * What the server's mail catcher writes in place of a link's secret (`MASKED_SECRET` of the API,
 * repeated here so that the Outbox does not load the API's schemas for one string; a spec checks that
 * both agree).
 */
export const MASKED_SECRET = '••••••';

/** Whether a text holds a link whose secret the mail catcher masked. */
export function hasMaskedSecret(text: string): boolean {
  return text.includes(MASKED_SECRET);
}

/** Web addresses in plain text; only http and https, so that no other scheme becomes clickable. */
const ADDRESS = /\bhttps?:\/\/[^\s<>"]+/gi;

/** Punctuation that ends a sentence more often than it ends an address ("…here: https://x/y."). */
const TRAILING = /[.,;:!?'")\]]+$/;

/**
 * Splits an e-mail's plain text into text and links, keeping every character of it. An address whose
 * secret is masked stays text: it would only lead to a page saying that the link is not valid.
 */
export function linkify(text: string): TextPart[] {
  const parts: TextPart[] = [];
  let last = 0;
  const addText = (run: string) => {
    const previous = parts[parts.length - 1];
    if (previous?.kind === 'text') parts[parts.length - 1] = { kind: 'text', text: previous.text + run };
    else parts.push({ kind: 'text', text: run });
  };
  for (const match of text.matchAll(ADDRESS)) {
    const start = match.index;
    const address = match[0].replace(TRAILING, '');
    if (start > last) addText(text.slice(last, start));
    if (hasMaskedSecret(address)) addText(address);
    else parts.push({ kind: 'link', text: address, href: address });
    last = start + address.length;
  }
  if (last < text.length) addText(text.slice(last));
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
