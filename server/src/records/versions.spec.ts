import { describe, expect, it } from 'vitest';
import { RECORDS_PROBLEM_CODES } from '@counterpoise/api';
import { ChangedMeanwhile, checkVersion, etagOf, parseIfMatch } from './versions';

describe('etagOf', () => {
  it('writes a strong, quoted ETag of the version', () => {
    expect(etagOf(7)).toBe('"7"');
  });
});

describe('parseIfMatch', () => {
  it.each([
    ['"3"', [3]],
    [' "3" ', [3]],
    ['"3", "12"', [3, 12]],
    ['"3","12"', [3, 12]],
    // Weak tags and tags that are not versions are well formed but can never match.
    ['W/"3"', []],
    ['"abc"', []],
    ['"0"', []],
    ['"03"', []],
    ['""', []],
  ])('reads %s as the versions %j', (header, versions) => {
    expect(parseIfMatch(header)).toEqual({ versions });
  });

  it.each([undefined, '', '   ', '*'])('asks for a version (428) when the header is %j', (header) => {
    const parsed = parseIfMatch(header);
    expect('problem' in parsed && parsed.problem).toMatchObject({
      status: 428,
      code: RECORDS_PROBLEM_CODES.versionRequired,
    });
  });

  it.each(['3', '"3', '3"', 'W/3', '"3" "4"', '"3",', '"a"b"', 'W/ "3"'])(
    'refuses %j as malformed, naming the header',
    (header) => {
      const parsed = parseIfMatch(header);
      expect('problem' in parsed && parsed.problem).toMatchObject({
        status: 400,
        errors: [{ path: 'If-Match', message: expect.stringContaining('quoted ETag') }],
      });
    },
  );
});

describe('checkVersion', () => {
  it('lets a change through on a version the client named, and refuses it with the record otherwise', () => {
    const current = { id: 4, version: 2 };
    expect(() => checkVersion(current, [1, 2], 'customer')).not.toThrow();
    let thrown: unknown;
    try {
      checkVersion(current, [1], 'customer');
    } catch (error) {
      thrown = error;
    }
    expect(thrown).toBeInstanceOf(ChangedMeanwhile);
    expect(thrown).toMatchObject({ status: 412, code: RECORDS_PROBLEM_CODES.changedMeanwhile, current });
  });
});
