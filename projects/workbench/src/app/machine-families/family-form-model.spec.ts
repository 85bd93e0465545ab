import { COMMON_PRACTICE_INSPECTION_LIMITS_IN } from '@counterpoise/engine';
import { describe, expect, it } from 'vitest';
import { changedFields } from '../records/record-fields';
import { aFamily } from '../records/testing';
import {
  COMMON_PRACTICE_LIMITS_MM,
  describeEvidence,
  familyFields,
  familyForm,
  familyRequest,
  fillFamilyForm,
  isRetyped,
} from './family-form-model';

/** Inches to millimetres, rounded to the hundredth a dial indicator reads. */
const toHundredthsOfMm = (inches: number) => Math.round(inches * 25.4 * 100) / 100;

describe('family form model', () => {
  it('starts from the engine’s common-practice inspection limits, in mm', () => {
    expect(COMMON_PRACTICE_LIMITS_MM.bearingEndPlayMm).toBe(
      toHundredthsOfMm(COMMON_PRACTICE_INSPECTION_LIMITS_IN.bearingEndPlay),
    );
    expect(COMMON_PRACTICE_LIMITS_MM.shaftRunoutMm).toBe(
      toHundredthsOfMm(COMMON_PRACTICE_INSPECTION_LIMITS_IN.stubShaftRunout),
    );
    expect(familyForm().controls.inspectionLimits.getRawValue()).toEqual(COMMON_PRACTICE_LIMITS_MM);
  });

  it('gives back a stored family unchanged', () => {
    const form = familyForm();
    fillFamilyForm(form, aFamily());
    expect(changedFields(familyFields(aFamily()), familyRequest(form))).toEqual({});
  });

  it('keeps what the jobs taught for a figure left as it was, and drops it for a retyped one', () => {
    const form = familyForm();
    fillFamilyForm(form, aFamily());
    const figure = form.controls.sensitivities.at(0);
    expect(isRetyped(figure)).toBe(false);
    figure.controls.gramsPerUnit.setValue(450);
    expect(isRetyped(figure)).toBe(true);
    expect(familyRequest(form).sensitivities).toEqual([
      {
        sensorSide: 'left',
        planeIndex: 0,
        gramsPerUnit: 450,
        unit: 'in/s-pk',
        phaseLagDeg: 35,
        jobCount: 0,
        spread: null,
      },
    ]);
    figure.controls.gramsPerUnit.setValue(410);
    expect(familyRequest(form).sensitivities[0]).toMatchObject({
      jobCount: 5,
      spread: { massPercent: 8, phaseDeg: 12 },
    });
  });

  it('refuses two figures for one sensor and plane, and one for a plane the family lacks', () => {
    const form = familyForm();
    fillFamilyForm(
      form,
      aFamily({ sensitivities: [...aFamily().sensitivities, ...aFamily().sensitivities] }),
    );
    expect(form.errors).toEqual({ sensitivities: 'Give at most one figure per sensor and plane.' });
    fillFamilyForm(form, aFamily({ sensitivities: [{ ...aFamily().sensitivities[0]!, planeIndex: 1 }] }));
    expect(form.errors).toBeNull();
    form.controls.planeCount.setValue(1);
    expect(form.errors).toEqual({
      sensitivities: 'A figure names a plane the family does not have (it has 1).',
    });
  });

  it('says what stands behind a stored figure', () => {
    expect(describeEvidence(aFamily().sensitivities[0]!)).toBe(
      'From 5 jobs, spread ±8 % in mass and ±12° in phase.',
    );
    expect(describeEvidence({ ...aFamily().sensitivities[0]!, jobCount: 0, spread: null })).toBe(
      'A rule of thumb typed in; no jobs behind it yet.',
    );
  });
});
