import { describe, expect, it } from 'vitest';
import { changedFields, initialFields } from './change-log';
import { withChange } from './versioned-records';

describe('changedFields', () => {
  const fields = ['name', 'acceptance', 'notes', 'contacts'] as const;
  interface Record {
    name: string;
    acceptance: object | null;
    notes: string | null;
    contacts: object[];
  }

  it('names the fields whose value changed, with both values', () => {
    const before: Record = { name: 'A', acceptance: null, notes: 'x', contacts: [] };
    const after: Record = { name: 'B', acceptance: null, notes: null, contacts: [] };
    expect(changedFields<Record>(before, after, fields)).toEqual([
      { field: 'name', before: 'A', after: 'B' },
      { field: 'notes', before: 'x', after: null },
    ]);
  });

  it('compares objects by their content, whatever the order of their keys', () => {
    const before: Record = {
      name: 'A',
      acceptance: { kind: 'shop-target', amplitude: 0.15 },
      notes: null,
      contacts: [],
    };
    const after: Record = {
      name: 'A',
      acceptance: { amplitude: 0.15, kind: 'shop-target' },
      notes: null,
      contacts: [],
    };
    expect(changedFields<Record>(before, after, fields)).toEqual([]);
    const moved: Record = { ...after, contacts: [{ name: 'B' }] };
    expect(changedFields<Record>(before, moved, fields)).toEqual([
      { field: 'contacts', before: [], after: [{ name: 'B' }] },
    ]);
  });

  it('lists what a new record started with, leaving out what is empty', () => {
    expect(initialFields<Record>({ name: 'A', acceptance: null, notes: 'x', contacts: [] }, fields)).toEqual([
      { field: 'name', before: null, after: 'A' },
      { field: 'notes', before: null, after: 'x' },
    ]);
  });
});

describe('withChange', () => {
  it('puts in the fields a change holds, null included, and keeps those it leaves out', () => {
    const current = { name: 'A', notes: 'x' as string | null, hours: 3 };
    expect(withChange(current, { notes: null, hours: undefined })).toEqual({
      name: 'A',
      notes: null,
      hours: 3,
    });
    expect(current.notes).toBe('x');
  });
});
