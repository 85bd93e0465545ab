import { describe, expect, it } from 'vitest';
import { CUSTOMER_FIELDS } from '../customers/customer-form-model';
import { changedFields, compareEdits, fieldValue, plainValue, sameValue } from './record-fields';

describe('record fields', () => {
  it('words values plainly: text quoted, numbers and lists as read, nothing for empty', () => {
    expect(plainValue('Home Farm')).toBe('“Home Farm”');
    expect(plainValue(2200)).toBe('2,200');
    expect(plainValue([50, 100])).toBe('50, 100');
    expect(plainValue(null)).toBe('nothing');
    expect(plainValue('  ')).toBe('nothing');
    expect(fieldValue('contacts', [{ name: 'Orla Penhallow', role: 'fleet manager' }], CUSTOMER_FIELDS)).toBe(
      'Orla Penhallow (fleet manager)',
    );
  });

  it('compares objects by content, whatever the order of their keys', () => {
    expect(sameValue({ kind: 'balance-grade', grade: 'G16' }, { grade: 'G16', kind: 'balance-grade' })).toBe(
      true,
    );
    expect(sameValue(null, undefined)).toBe(true);
    expect(sameValue([1, 2], [2, 1])).toBe(false);
  });

  it('finds the fields a form changed, so that a PATCH sends those alone', () => {
    const before = { name: 'Bramblecote', phone: '+44 1632 960 100', contacts: [{ name: 'Orla' }] };
    const after = { name: 'Bramblecote', phone: '+44 1632 960 999', contacts: [{ name: 'Orla' }] };
    expect(changedFields(before, after)).toEqual({ phone: '+44 1632 960 999' });
    expect(changedFields(before, before)).toEqual({});
  });

  it('compares two edits field by field: yours, theirs, and those both changed', () => {
    const base = { name: 'Bramblecote', phone: '1', notes: null, email: 'a@example.com' };
    const theirs = {
      name: 'Bramblecote Estate',
      phone: '2',
      notes: 'Gate code 4412',
      email: 'a@example.com',
    };
    const mine = { phone: '3', email: 'b@example.com', name: 'Bramblecote Estate' };
    const rows = compareEdits(base, theirs, mine, CUSTOMER_FIELDS);
    expect(rows).toEqual([
      { field: 'phone', label: 'phone number', theirs: '“2”', mine: '“3”', changedBy: 'both' },
      {
        field: 'email',
        label: 'e-mail address',
        theirs: '“a@example.com”',
        mine: '“b@example.com”',
        changedBy: 'you',
      },
      { field: 'notes', label: 'notes', theirs: '“Gate code 4412”', mine: null, changedBy: 'them' },
    ]);
  });
});
