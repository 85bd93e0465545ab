import { describe, expect, it } from 'vitest';
import {
  AcceptInvitationSchema,
  CreateApiKeySchema,
  escapeHiddenCharacters,
  fieldErrorsOf,
  InviteRequestSchema,
  OrganisationNameSchema,
  PersonNameSchema,
} from './index';

/** One character of each class the rule refuses, placed inside a name where trimming cannot remove it. */
const REFUSED: readonly (readonly [string, string])[] = [
  ['C0 control: NUL', '\u0000'],
  ['C0 control: escape, as in ANSI colour codes', '\u001B'],
  ['C0 control: tab', '\t'],
  ['C0 control: line feed', '\n'],
  ['C0 control: carriage return', '\r'],
  ['DEL', '\u007F'],
  ['C1 control: next line', '\u0085'],
  ['C1 control: control sequence introducer', '\u009B'],
  ['left-to-right mark', '\u200E'],
  ['right-to-left mark', '\u200F'],
  ['Arabic letter mark', '\u061C'],
  ['left-to-right embedding', '\u202A'],
  ['right-to-left embedding', '\u202B'],
  ['pop directional formatting', '\u202C'],
  ['left-to-right override', '\u202D'],
  ['right-to-left override', '\u202E'],
  ['left-to-right isolate', '\u2066'],
  ['right-to-left isolate', '\u2067'],
  ['first strong isolate', '\u2068'],
  ['pop directional isolate', '\u2069'],
  ['zero-width space', '\u200B'],
  ['word joiner', '\u2060'],
  ['invisible separator', '\u2063'],
  ['byte-order mark', '\uFEFF'],
  ['soft hyphen', '\u00AD'],
  ['line separator', '\u2028'],
  ['paragraph separator', '\u2029'],
  ['tag letter A (hidden text)', '\u{E0041}'],
  ['lone surrogate', '\uD800'],
];

const codeOf = (character: string) =>
  `U+${character.codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0')}`;

describe('names people read', () => {
  it.each(REFUSED)('refuse a %s in every kind of name, naming the field', (_, character) => {
    const name = `Dealer${character}portal`;
    const expected = (field: string) => ({
      path: field,
      message: expect.stringContaining(`holds ${codeOf(character)}, an invisible control or text-direction`),
    });

    const key = CreateApiKeySchema.safeParse({ name });
    expect(fieldErrorsOf(key.error!)).toEqual([expected('name')]);
    expect(key.error!.issues[0]!.message).toMatch(/^The name of a key holds /);

    const invite = InviteRequestSchema.safeParse({ email: 'ines@shop.test', role: 'viewer', name });
    expect(fieldErrorsOf(invite.error!)).toEqual([expected('name')]);

    const accept = AcceptInvitationSchema.safeParse({ name, password: 'a long enough passphrase' });
    expect(fieldErrorsOf(accept.error!)).toEqual([expected('name')]);
    expect(accept.error!.issues[0]!.message).toMatch(/^The name holds /);

    const organisation = OrganisationNameSchema.safeParse(name);
    expect(organisation.error!.issues[0]!.message).toMatch(/^The name of an organisation holds /);
  });

  it('take names in any script, with accents, joiners and emoji, trimmed', () => {
    for (const name of [
      'Zoë Ångström-Nuñez',
      'علی\u200Cرضا',
      'שירה כהן',
      '渡辺 千尋',
      'Field crew 👩\u200D🔧',
      'Portal ✔\uFE0F',
    ]) {
      expect(PersonNameSchema.parse(`  ${name}\n`)).toBe(name);
      expect(CreateApiKeySchema.parse({ name }).name).toBe(name);
    }
  });

  it('keep their rules of length and presence, with their own words', () => {
    expect(PersonNameSchema.safeParse('   ').error!.issues[0]!.message).toBe('Enter a name.');
    expect(OrganisationNameSchema.safeParse('').error!.issues[0]!.message).toBe('Name the organisation.');
    expect(CreateApiKeySchema.safeParse({ name: 'x'.repeat(101) }).error!.issues[0]!.message).toBe(
      'Keep the name of a key to 100 characters.',
    );
    expect(CreateApiKeySchema.safeParse({}).error!.issues[0]!.message).toBe(
      'Give the key a name that says who or what uses it.',
    );
  });
});

describe('escapeHiddenCharacters', () => {
  it('writes each refused character as a visible escape and leaves the rest alone', () => {
    expect(escapeHiddenCharacters('Portal\u202Etxt.exe')).toBe('Portal\\u202Etxt.exe');
    expect(escapeHiddenCharacters('a\tb\nc\rd')).toBe('a\\tb\\nc\\rd');
    expect(escapeHiddenCharacters('\u001B[31mred\u001B[0m')).toBe('\\u001B[31mred\\u001B[0m');
    expect(escapeHiddenCharacters('hidden\u{E0041}\u{E0042}')).toBe('hidden\\u{E0041}\\u{E0042}');
    expect(escapeHiddenCharacters('Zoë 👩\u200D🔧 علی\u200Cرضا')).toBe('Zoë 👩\u200D🔧 علی\u200Cرضا');
    for (const [, character] of REFUSED) {
      expect(escapeHiddenCharacters(`x${character}y`)).toMatch(/^x\\(u[0-9A-F]{4}|u\{[0-9A-F]+\}|[tnr])y$/);
    }
  });
});
