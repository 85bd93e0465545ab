import {
  AMPLITUDE_UNITS,
  CUSTOMER_SORT_FIELDS,
  FIELD_BALANCE_GRADES,
  MACHINE_FAMILY_SORT_FIELDS,
  MACHINE_SIDES,
  MACHINE_SORT_FIELDS,
  ROTOR_TYPES,
} from '@counterpoise/api';
import { describe, expect, it } from 'vitest';
import {
  AMPLITUDE_UNIT_LABELS,
  BALANCE_GRADES,
  describeAcceptance,
  opposite,
  planeName,
  planeSide,
  ROTOR_TYPE_LABELS,
  SIDE_LABELS,
} from './record-labels';

describe('record labels', () => {
  it('name every value the API knows, and no other (the lists are repeated to keep zod out of the pages)', () => {
    expect(Object.keys(ROTOR_TYPE_LABELS)).toEqual([...ROTOR_TYPES]);
    expect(Object.keys(AMPLITUDE_UNIT_LABELS)).toEqual([...AMPLITUDE_UNITS]);
    expect(BALANCE_GRADES.map((grade) => grade.grade)).toEqual([...FIELD_BALANCE_GRADES]);
    expect(Object.keys(SIDE_LABELS)).toEqual([...MACHINE_SIDES]);
  });

  it('sort the lists by fields the API sorts by', () => {
    // The pages name these fields; the API must still accept them.
    expect(CUSTOMER_SORT_FIELDS).toEqual(['name', 'updatedAt', 'createdAt']);
    expect(MACHINE_FAMILY_SORT_FIELDS).toEqual(['name', 'rotorType', 'updatedAt']);
    expect(MACHINE_SORT_FIELDS).toEqual(['serialNumber', 'customerName', 'make', 'updatedAt']);
  });

  it('words each kind of acceptance level, the zones as guidance', () => {
    expect(describeAcceptance({ kind: 'shop-target', amplitude: 0.12, unit: 'in/s-pk' })).toBe(
      'Shop target 0.12 in/s peak',
    );
    expect(describeAcceptance({ kind: 'balance-grade', grade: 'G16' })).toBe(
      'Balance grade G16 (ISO 21940-11)',
    );
    expect(describeAcceptance({ kind: 'severity-zone', zone: 'B', group: 2, foundation: 'flexible' })).toBe(
      'Zone B or better, group 2 – medium-sized machines, flexible foundation (ISO 10816-3 / 20816-3, as guidance)',
    );
  });

  it('names planes and the end each is seen from; the far end sees the other rotation', () => {
    expect(planeName(0, 1)).toBe('The plane');
    expect([planeName(0, 2), planeName(1, 2)]).toEqual(['Left plane', 'Right plane']);
    expect([planeSide(0, 2), planeSide(1, 2), planeSide(0, 1)]).toEqual(['left', 'right', 'left']);
    expect(opposite('clockwise')).toBe('counterClockwise');
    expect(opposite('counterClockwise')).toBe('clockwise');
  });
});
