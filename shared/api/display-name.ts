import * as z from 'zod';

/**
 * Characters a name shown to people must not hold, because they change how the text around them reads
 * while staying invisible themselves:
 * - controls, C0 (U+0000–001F), DEL and C1 (U+0080–009F): a terminal acts on them (ANSI escapes, carriage
 *   returns that overwrite a line) and they split a line in logs;
 * - direction marks, embeddings, overrides and isolates (U+061C, U+200E–200F, U+202A–202E, U+2066–2069):
 *   they reorder what follows, so that `Portal‮exe.txt` reads as another name;
 * - invisible characters that make two names look the same: soft hyphen U+00AD, U+180E, zero-width space
 *   U+200B, word joiner and invisible operators U+2060–2064, the deprecated format characters
 *   U+206A–206F, the byte-order mark U+FEFF, annotation marks U+FFF9–FFFB, tags U+E0000–E007F (which
 *   can carry hidden text), and the line and paragraph separators U+2028–2029;
 * - lone surrogates, which are not characters at all.
 * The zero-width joiner and non-joiner (U+200C–200D) stay allowed: Persian and Indic names and emoji
 * sequences need them, and neither reorders nor hides text.
 */
export const HIDDEN_CHARACTERS =
  /[\p{Cc}\p{Cs}\u00AD\u061C\u180E\u200B\u200E\u200F\u2028-\u202E\u2060-\u206F\uFEFF\uFFF9-\uFFFB\u{E0000}-\u{E007F}]/u;

const HIDDEN_CHARACTERS_EVERYWHERE = new RegExp(HIDDEN_CHARACTERS.source, 'gu');

/** `U+202E`, the way people look a character up. */
function codePointName(character: string): string {
  return `U+${character.codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0')}`;
}

/**
 * A name people read (of a person, an organisation or an API key): trimmed, not empty, at most
 * `maxLength` characters, and free of `HIDDEN_CHARACTERS`. `field` names it in the messages the way a
 * sentence would ("the name of a key"), so that each message says which name is at fault and why.
 */
export function displayName(options: { field: string; maxLength: number; missing: string }): z.ZodString {
  const { field, maxLength, missing } = options;
  return z
    .string({ error: missing })
    .trim()
    .min(1, { error: missing })
    .max(maxLength, { error: `Keep ${field} to ${maxLength} characters.` })
    .refine((name) => !HIDDEN_CHARACTERS.test(name), {
      error: (issue) => {
        const found = HIDDEN_CHARACTERS.exec(String(issue.input))?.[0] ?? '';
        return (
          `${field[0]!.toUpperCase()}${field.slice(1)} holds ${codePointName(found)}, an invisible control or ` +
          'text-direction character; type it again without such characters.'
        );
      },
    });
}

/**
 * Text as a terminal should print it: every `HIDDEN_CHARACTERS` character written as a visible escape
 * (`\u202E`, `\n`, `\u{E0041}`), so that a name stored before the rule existed can neither move the
 * cursor, recolour the screen nor reorder the line it is printed in.
 */
export function escapeHiddenCharacters(text: string): string {
  return text.replace(HIDDEN_CHARACTERS_EVERYWHERE, (character) => {
    if (character === '\n') return '\\n';
    if (character === '\r') return '\\r';
    if (character === '\t') return '\\t';
    const code = character.codePointAt(0)!;
    return code > 0xffff
      ? `\\u{${code.toString(16).toUpperCase()}}`
      : `\\u${code.toString(16).toUpperCase().padStart(4, '0')}`;
  });
}
