import { FormControl } from '@angular/forms';
import {
  AcceptanceLevelSchema,
  ContactPersonSchema,
  CreateCustomerSchema,
  CreateMachineFamilySchema,
  CreateMachineSchema,
  InspectionLimitsSchema,
  PlaneLayoutSchema,
  StoredSensitivitySchema,
} from '@counterpoise/api';
import { describe, expect, it } from 'vitest';
import type * as z from 'zod';
import { emailAddress, maxChars, numberWithin, phoneNumber, RECORD_RULES as RULES } from './record-rules';

const accepts = (schema: z.ZodType, value: unknown) => schema.safeParse(value).success;
const text = (length: number) => 'x'.repeat(length);

/** The highest value a schema accepts is `max`: a hair above it is refused. */
function expectMax(schema: z.ZodType, max: number) {
  expect(accepts(schema, max), `accepts ${max}`).toBe(true);
  expect(accepts(schema, max + 0.001), `refuses above ${max}`).toBe(false);
}

/** The longest text a schema accepts has `max` characters. */
function expectMaxLength(schema: z.ZodType, max: number) {
  expect(accepts(schema, text(max)), `accepts ${max} characters`).toBe(true);
  expect(accepts(schema, text(max + 1)), `refuses ${max + 1} characters`).toBe(false);
}

describe('RECORD_RULES', () => {
  it('hold the text lengths the shared schemas allow', () => {
    const customer = CreateCustomerSchema.shape;
    const machine = CreateMachineSchema.shape;
    expectMaxLength(customer.name, RULES.customerNameMaxLength);
    expectMaxLength(customer.siteAddress, RULES.siteAddressMaxLength);
    expectMaxLength(customer.notes, RULES.notesMaxLength);
    expectMaxLength(ContactPersonSchema.shape.name, RULES.contactNameMaxLength);
    expectMaxLength(ContactPersonSchema.shape.role, RULES.contactRoleMaxLength);
    expectMaxLength(CreateMachineFamilySchema.shape.name, RULES.familyNameMaxLength);
    expectMaxLength(machine.make, RULES.makeMaxLength);
    expectMaxLength(machine.model, RULES.modelMaxLength);
    expectMaxLength(machine.serialNumber, RULES.serialNumberMaxLength);
    expectMaxLength(
      PlaneLayoutSchema.shape.blockedSectors.unwrap().element.shape.label,
      RULES.sectorLabelMaxLength,
    );
  });

  it('hold the number bounds the shared schemas allow', () => {
    const machine = CreateMachineSchema.shape;
    expectMax(machine.operatingSpeedRpm, RULES.maxSpeedRpm);
    expectMax(CreateMachineFamilySchema.shape.nominalSpeedRpm, RULES.maxSpeedRpm);
    expectMax(PlaneLayoutSchema.shape.correctionRadiusMm, RULES.maxRadiusMm);
    expectMax(machine.hours, RULES.maxHours);
    expectMax(machine.rotorMassKg, RULES.maxRotorMassKg);
    expectMax(machine.stockWeightsGrams.unwrap().element, RULES.maxStockWeightGrams);
    expectMax(InspectionLimitsSchema.shape.bearingEndPlayMm, RULES.maxEndPlayMm);
    expectMax(InspectionLimitsSchema.shape.shaftRunoutMm, RULES.maxRunoutMm);
    expectMax(StoredSensitivitySchema.shape.gramsPerUnit, RULES.maxGramsPerUnit);
    const target = (amplitude: number) =>
      accepts(AcceptanceLevelSchema, { kind: 'shop-target', amplitude, unit: 'in/s-pk' });
    expect(target(RULES.maxTargetAmplitude)).toBe(true);
    expect(target(RULES.maxTargetAmplitude + 0.001)).toBe(false);
  });

  it('hold the counts the shared schemas allow', () => {
    const positions = (count: number) =>
      accepts(PlaneLayoutSchema, { correctionRadiusMm: 200, positions: { count, firstDeg: 0 } });
    expect(positions(RULES.minPositions)).toBe(true);
    expect(positions(RULES.minPositions - 1)).toBe(false);
    expect(positions(RULES.maxPositions)).toBe(true);
    expect(positions(RULES.maxPositions + 1)).toBe(false);
    const sector = { fromDeg: 0, toDeg: 10, label: 'holder' };
    const sectors = (count: number) =>
      accepts(PlaneLayoutSchema, { correctionRadiusMm: 200, blockedSectors: Array(count).fill(sector) });
    expect(sectors(RULES.maxBlockedSectors)).toBe(true);
    expect(sectors(RULES.maxBlockedSectors + 1)).toBe(false);
    const contacts = (count: number) =>
      accepts(CreateCustomerSchema, { name: 'Wrenhollow', contacts: Array(count).fill({ name: 'Orla' }) });
    expect(contacts(RULES.maxContacts)).toBe(true);
    expect(contacts(RULES.maxContacts + 1)).toBe(false);
    const stock = (count: number) =>
      accepts(
        CreateMachineSchema.shape.stockWeightsGrams,
        Array.from({ length: count }, (_, i) => i + 1),
      );
    expect(stock(RULES.maxStockSizes)).toBe(true);
    expect(stock(RULES.maxStockSizes + 1)).toBe(false);
  });
});

describe('record validators', () => {
  const errorOf = (validator: ReturnType<typeof emailAddress>, value: unknown) =>
    validator(new FormControl(value));

  it('agree with the schemas on e-mail addresses and phone numbers', () => {
    for (const email of ['yard@bramblecote.example.com', 'a@b.co']) {
      expect(errorOf(emailAddress(), email)).toBeNull();
      expect(accepts(CreateCustomerSchema.shape.email, email)).toBe(true);
    }
    for (const email of ['yard', 'yard@', 'two words@example.com']) {
      expect(errorOf(emailAddress(), email)).not.toBeNull();
      expect(accepts(CreateCustomerSchema.shape.email, email)).toBe(false);
    }
    expect(errorOf(phoneNumber(), '+44 (0)1632 960-118')).toBeNull();
    expect(errorOf(phoneNumber(), 'call the yard')).toEqual({
      phone: 'Write the phone number with digits, spaces and + ( ) - . / only.',
    });
    expect(errorOf(emailAddress(), '')).toBeNull();
  });

  it('check number bounds with the message given, letting an empty field pass', () => {
    const radius = numberWithin(
      { above: 0, max: 5000 },
      'The correction radius is above 0 and at most 5000 mm.',
    );
    expect(errorOf(radius, 240)).toBeNull();
    expect(errorOf(radius, null)).toBeNull();
    expect(errorOf(radius, 0)).toEqual({ range: 'The correction radius is above 0 and at most 5000 mm.' });
    expect(errorOf(radius, 5001)).not.toBeNull();
    expect(errorOf(numberWithin({ min: 2, whole: true }, 'whole'), 2.5)).toEqual({ range: 'whole' });
    expect(errorOf(maxChars(3, 'too long'), ' abc ')).toBeNull();
    expect(errorOf(maxChars(3, 'too long'), 'abcd')).toEqual({ maxChars: 'too long' });
  });
});
