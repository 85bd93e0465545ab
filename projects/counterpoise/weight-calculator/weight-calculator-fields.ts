import type { CalcMethod } from './weight-calculator-model';

/*
 * The words of each field of the calculator, by its path in the method's form (`withTrial.phaseDeg`,
 * `runs.1.readings.0.amplitude`): the label on the screen, the name in its error messages, the section it
 * sits in and the kind of value it holds. One place for them, so that the template's labels, the messages
 * under the fields and the errors a dealer's form reads never disagree. Framework-free.
 */

/** What a field holds: the unit, step and input it gets follow from it. */
export type FieldKind = 'amplitude' | 'phase' | 'mass' | 'angle' | 'sensitivity' | 'offset';

/** How a field is named. */
export interface FieldWords {
  /** The label on the screen: "Trial run phase". */
  readonly label: string;
  /** The field in a sentence: "trial run phase" ("Enter the trial run phase."). */
  readonly what: string;
  /** The part of the form it sits in: "Run 2: trial weight on". */
  readonly section: string;
  /** What it holds. */
  readonly kind: FieldKind;
}

const KIND_WORDS: Readonly<Record<string, { readonly kind: FieldKind; readonly word: string }>> = {
  amplitude: { kind: 'amplitude', word: 'amplitude' },
  phaseDeg: { kind: 'phase', word: 'phase' },
  mass: { kind: 'mass', word: 'mass' },
  angleDeg: { kind: 'angle', word: 'angle' },
};

function named(prefix: string, key: string, section: string): FieldWords {
  const known = KIND_WORDS[key];
  if (known === undefined) throw new Error(`The weight calculator has no field named "${key}".`);
  const what = prefix === '' ? known.word : `${prefix} ${known.word}`;
  return { label: what.charAt(0).toUpperCase() + what.slice(1), what, section, kind: known.kind };
}

function oneRun(segments: readonly string[]): FieldWords {
  const [group, key = ''] = segments;
  if (group === 'reading') return named('', key, 'Reading');
  const section = 'Stored sensitivity of the machine family';
  if (key === 'massPerAmplitude') {
    return { label: 'Sensitivity', what: 'sensitivity', section, kind: 'sensitivity' };
  }
  return { label: 'Phase offset (optional)', what: 'phase offset', section, kind: 'offset' };
}

function singlePlane(segments: readonly string[]): FieldWords {
  const [group, key = ''] = segments;
  if (group === 'initial') return named('initial', key, 'Run 1: no weight');
  if (group === 'trialWeight') return named('trial', key, 'Trial weight');
  return named('trial run', key, 'Run 2: trial weight on');
}

function multiPlane(segments: readonly string[]): FieldWords {
  if (segments[0] === 'initial') {
    const sensor = Number(segments[1]) + 1;
    return named(`sensor ${sensor}`, segments[2] ?? '', `Run 1: no weight, sensor ${sensor}`);
  }
  const run = Number(segments[1]);
  const section = `Run ${run + 2}: trial weight in plane ${run + 1}`;
  if (segments[2] === 'trialWeight') return named(`plane ${run + 1} trial`, segments[3] ?? '', section);
  const sensor = Number(segments[3]) + 1;
  return named(`sensor ${sensor}`, segments[4] ?? '', `${section}, sensor ${sensor}`);
}

function fourRun(segments: readonly string[]): FieldWords {
  if (segments[0] === 'initialAmplitude') return named('initial', 'amplitude', 'Run 1: no weight');
  if (segments[0] === 'trialMass') return named('trial', 'mass', 'Run 1: no weight');
  const run = Number(segments[1]) + 2;
  const section = `Run ${run}: trial weight at position ${run - 1}`;
  return segments[2] === 'angleDeg'
    ? named(`run ${run} trial`, 'angleDeg', section)
    : named(`run ${run}`, 'amplitude', section);
}

/** The words of a field of a method, by its dotted path in the method's form. */
export function describeField(method: CalcMethod, field: string): FieldWords {
  const segments = field.split('.');
  switch (method) {
    case 'one-run':
      return oneRun(segments);
    case 'single-plane':
      return singlePlane(segments);
    case 'multi-plane':
      return multiPlane(segments);
    case 'four-run':
      return fourRun(segments);
  }
}
