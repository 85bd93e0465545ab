import { convertToParamMap } from '@angular/router';
import { describe, expect, it } from 'vitest';
import { apiListQuery, listCount, listQueryParams, type ListQueryOptions, readListQuery } from './list-query';

const OPTIONS: ListQueryOptions<'serialNumber' | 'customerName'> = {
  sortFields: ['serialNumber', 'customerName'],
  idFilters: ['customerId', 'familyId'],
};

describe('list query in the address', () => {
  it('reads the defaults from an empty query string', () => {
    expect(readListQuery(convertToParamMap({}), OPTIONS)).toEqual({
      q: '',
      archived: 'false',
      sort: 'serialNumber',
      order: 'asc',
      page: 1,
      pageSize: 25,
      filters: {},
    });
  });

  it('reads search, filters, sort and page, and falls back on values the server would refuse', () => {
    const read = (params: Record<string, string>) => readListQuery(convertToParamMap(params), OPTIONS);
    expect(
      read({
        q: 'TM225',
        archived: 'all',
        sort: 'customerName',
        order: 'desc',
        page: '3',
        pageSize: '50',
        customerId: '7',
      }),
    ).toEqual({
      q: 'TM225',
      archived: 'all',
      sort: 'customerName',
      order: 'desc',
      page: 3,
      pageSize: 50,
      filters: { customerId: 7 },
    });
    expect(
      read({ archived: 'maybe', sort: 'price', page: 'abc', pageSize: '7', familyId: '-2' }),
    ).toMatchObject({
      archived: 'false',
      sort: 'serialNumber',
      page: 1,
      pageSize: 25,
      filters: {},
    });
  });

  it('writes only what differs from the defaults, so that links stay short', () => {
    const state = readListQuery(convertToParamMap({}), OPTIONS);
    expect(listQueryParams(state, OPTIONS)).toEqual({
      q: null,
      archived: null,
      sort: null,
      order: null,
      page: null,
      pageSize: null,
      customerId: null,
      familyId: null,
    });
    expect(
      listQueryParams(
        { ...state, q: ' drum ', page: 2, sort: 'customerName', filters: { familyId: 4 } },
        OPTIONS,
      ),
    ).toMatchObject({ q: 'drum', page: 2, sort: 'customerName', familyId: 4, customerId: null });
  });

  it('gives the API the query with the search trimmed and the filters flattened', () => {
    const state = readListQuery(convertToParamMap({ q: ' TM225 ', customerId: '7' }), OPTIONS);
    expect(apiListQuery(state)).toEqual({
      q: 'TM225',
      archived: 'false',
      sort: 'serialNumber',
      order: 'asc',
      page: 1,
      pageSize: 25,
      customerId: 7,
    });
    expect(apiListQuery({ ...state, q: '' })).not.toHaveProperty('q');
  });

  it('counts what the query found in a sentence', () => {
    const nouns = ['machine', 'machines'] as const;
    expect(listCount(12, nouns, { archived: 'false', q: '', filters: {} })).toBe('12 machines in use.');
    expect(listCount(1, nouns, { archived: 'false', q: 'TM225', filters: {} })).toBe(
      '1 machine in use matches “TM225”.',
    );
    expect(listCount(0, nouns, { archived: 'all', q: 'TM225', filters: { customerId: 7 } })).toBe(
      '0 machines in all match “TM225” and the filters.',
    );
    expect(listCount(3, nouns, { archived: 'true', q: '', filters: { familyId: 4 } })).toBe(
      '3 machines archived match the filters.',
    );
  });
});
