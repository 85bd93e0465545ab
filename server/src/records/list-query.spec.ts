import { describe, expect, it } from 'vitest';
import { containsPattern, foldCase, pageWindow, searchTextOf } from './list-query';

describe('the search', () => {
  it('folds case by Unicode’s rules, beyond ASCII', () => {
    expect(foldCase('ÖSTBERG Ærø ΣΟΦΊΑ')).toBe('östberg ærø σοφία');
  });

  it('takes %, _ and the escape character literally', () => {
    expect(containsPattern('100%')).toBe('%100\\%%');
    expect(containsPattern('a_b')).toBe('%a\\_b%');
    expect(containsPattern('C:\\')).toBe('%c:\\\\%');
  });

  it('keeps each searchable value on a line of its own, leaving out the empty ones', () => {
    expect(searchTextOf(['Alder Creek', null, '', undefined, 'Juno HARTWELL'])).toBe(
      'alder creek\njuno hartwell',
    );
  });
});

describe('pageWindow', () => {
  it('skips the pages before the one asked for', () => {
    expect(pageWindow({ page: 1, pageSize: 25 })).toEqual({ limit: 25, offset: 0 });
    expect(pageWindow({ page: 3, pageSize: 10 })).toEqual({ limit: 10, offset: 20 });
  });
});
