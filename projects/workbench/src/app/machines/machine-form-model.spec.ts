import { describe, expect, it } from 'vitest';
import { changedFields } from '../records/record-fields';
import { aMachine } from '../records/testing';
import {
  fillMachineForm,
  machineFields,
  machineForm,
  machineRequest,
  sectorGroup,
} from './machine-form-model';

describe('machine form model', () => {
  it('gives back a stored machine unchanged, so that an untouched form sends nothing', () => {
    const form = machineForm();
    fillMachineForm(form, aMachine());
    expect(machineRequest(form)).toEqual(machineFields(aMachine()));
    expect(changedFields(machineFields(aMachine()), machineRequest(form))).toEqual({});
  });

  it('sends a changed plane as the whole list of planes, and nothing else', () => {
    const form = machineForm();
    fillMachineForm(form, aMachine());
    form.controls.planes
      .at(1)
      .controls.blockedSectors.push(sectorGroup({ fromDeg: 170, toDeg: 185, label: 'weld' }));
    const change = changedFields(machineFields(aMachine()), machineRequest(form));
    expect(Object.keys(change)).toEqual(['planes']);
    expect(change.planes?.[1]?.blockedSectors).toEqual([{ fromDeg: 170, toDeg: 185, label: 'weld' }]);
  });

  it('checks positions only where weights go at fixed positions', () => {
    const form = machineForm();
    const positions = form.controls.planes.at(0).controls.positions;
    expect(positions.controls.count.disabled).toBe(true);
    positions.controls.fixed.setValue(true);
    expect(positions.controls.count.enabled).toBe(true);
    expect(positions.controls.count.errors).toEqual({ required: 'Enter how many positions there are.' });
    positions.controls.count.setValue(1);
    expect(positions.controls.count.errors?.['range']).toBe(
      'Give a whole number of positions from 2 to 360.',
    );
  });

  it('asks for a customer chosen from the list and at least one sensor', () => {
    const form = machineForm();
    form.controls.customerId.setValue('Bramble');
    expect(form.controls.customerId.errors).toEqual({
      customer: 'Choose the customer from the list that opens as you type.',
    });
    form.controls.sensorSides.setValue({ left: false, right: false });
    expect(form.controls.sensorSides.errors).toEqual({ sides: 'At least one side carries a sensor.' });
  });
});
