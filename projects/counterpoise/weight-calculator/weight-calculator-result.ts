import {
  _degreesText as degreesText,
  _formatAngle as formatAngle,
  _normalizeDeg as normalizeDeg,
} from '@counterpoise/ng/core';
import type {
  AmplitudeUnit,
  CorrectionPlacement,
  MassUnit,
  MethodAnswer,
  WeightCalculation,
} from './weight-calculator-model';
import { formatAmplitude, formatMass, influenceUnit, spokenMass } from './weight-calculator-units';

/** An angle as the panel shows it, in whole degrees within [0, 360): "253°". A weight is never placed finer. */
function angleText(angleDeg: number): string {
  return degreesText(angleDeg, 0);
}

/** An angle as a screen reader speaks it: "253 degrees". */
function spokenAngle(angleDeg: number): string {
  return `${formatAngle(angleDeg, 0)} degrees`;
}

/*
 * What the result panel shows, worked out from a calculation as plain text, so that it is tested without
 * TestBed and the template only lays it out.
 */

/** A weight to install, as the panel shows it. */
export interface CorrectionView {
  /** The correction plane, from 1. */
  readonly plane: number;
  /** What the weight is: "Correction weight", "Plane 2: add to the trial weights". */
  readonly title: string;
  /** The mass in the calculation's unit. */
  readonly mass: number;
  /** The angle from the reference mark, in [0, 360). */
  readonly angleDeg: number;
  /** "84.2 g". */
  readonly massText: string;
  /** "253°". */
  readonly angleText: string;
  /** The whole weight in words, for screen readers: "84.2 grams at 253 degrees". */
  readonly spoken: string;
  /** The weights it is split into where a weight can really go; empty when it goes on whole. */
  readonly split: readonly { readonly text: string; readonly spoken: string }[];
  /** Warnings about the split. */
  readonly splitWarnings: readonly string[];
}

/** A named figure of the result. */
export interface ResultFact {
  /** What the figure is. */
  readonly label: string;
  /** The figure with its unit. */
  readonly text: string;
}

/** Everything the result panel shows. */
export interface ResultView {
  /** The weights to install, one per plane. */
  readonly corrections: readonly CorrectionView[];
  /** The heavy spot per plane, where the method tells it; null where it does not. */
  readonly heavySpotsDeg: readonly (number | null)[];
  /** The reading expected after the correction, per sensor; empty when the method cannot predict it. */
  readonly residuals: readonly ResultFact[];
  /** Further figures: trial effect, influence coefficient, condition number, consistency. */
  readonly facts: readonly ResultFact[];
  /** What the technician should know, in the engine's words. */
  readonly warnings: readonly string[];
  /** Weights that stay on the rotor from the trial runs, per plane, which the correction adds to. */
  readonly weightsLeftOn: readonly {
    readonly plane: number;
    readonly mass: number;
    readonly angleDeg: number;
  }[];
}

function reading(amplitude: number, phaseDeg: number, unit: AmplitudeUnit): string {
  return `${formatAmplitude(amplitude, unit)} at ${angleText(phaseDeg)}`;
}

function correction(
  plane: number,
  title: string,
  weight: { mass: number; angleDeg: number },
  massUnit: MassUnit,
  placement: CorrectionPlacement | undefined,
): CorrectionView {
  const angleDeg = normalizeDeg(weight.angleDeg);
  const whole = placement === undefined || placement.weights.length < 2;
  const split = whole
    ? []
    : placement.weights.map((part) => ({
        text: `${formatMass(part.mass, massUnit)} at ${angleText(part.angleDeg)}`,
        spoken: `${spokenMass(part.mass, massUnit)} at ${spokenAngle(part.angleDeg)}`,
      }));
  return {
    plane,
    title,
    mass: weight.mass,
    angleDeg,
    massText: formatMass(weight.mass, massUnit),
    angleText: angleText(angleDeg),
    spoken: `${spokenMass(weight.mass, massUnit)} at ${spokenAngle(angleDeg)}`,
    split,
    splitWarnings: placement?.warnings ?? [],
  };
}

/**
 * The weights to install now, per plane: what goes on the rotor as it stands after the last run (the
 * trial weights off, or left on when the technician chose so). These are what get placed.
 */
export function correctionsToInstall(
  answer: MethodAnswer,
): { plane: number; mass: number; angleDeg: number }[] {
  switch (answer.method) {
    case 'one-run':
    case 'single-plane':
    case 'four-run':
      return [{ plane: 1, mass: answer.result.correction.mass, angleDeg: answer.result.correction.angleDeg }];
    case 'multi-plane': {
      const lastRun = answer.request.runs[answer.request.runs.length - 1];
      const leftOn = lastRun !== undefined && lastRun.weights.length > 1;
      return (leftOn ? answer.result.toAdd : answer.result.corrections).map(({ plane, mass, angleDeg }) => ({
        plane,
        mass,
        angleDeg,
      }));
    }
  }
}

/** The heavy spot opposite a correction that balances the bare rotor. */
function opposite(angleDeg: number): number {
  return normalizeDeg(angleDeg + 180);
}

/** The result panel's content for a finished calculation. */
export function describeResult(calculation: WeightCalculation): ResultView {
  const { massUnit, amplitudeUnit } = calculation;
  const placement = (plane: number) => calculation.placements.find((one) => one.plane === plane);
  switch (calculation.method) {
    case 'one-run': {
      const { result } = calculation;
      return {
        corrections: [correction(1, 'Correction weight', result.correction, massUnit, placement(1))],
        heavySpotsDeg: [normalizeDeg(result.heavySpotDeg)],
        residuals: [],
        facts: [{ label: 'Heavy spot', text: angleText(result.heavySpotDeg) }],
        warnings: [...result.warnings],
        weightsLeftOn: [],
      };
    }
    case 'single-plane': {
      const { result, request } = calculation;
      const removed = request.trialWeightRemoved !== false;
      const title = removed ? 'Correction weight' : 'Add to the trial weight';
      const facts: ResultFact[] = [];
      if (!removed) {
        facts.push({
          label: 'Total correction, trial weight included',
          text: `${formatMass(result.totalCorrection.mass, massUnit)} at ${angleText(result.totalCorrection.angleDeg)}`,
        });
      }
      facts.push(
        { label: 'Heavy spot', text: angleText(opposite(result.totalCorrection.angleDeg)) },
        {
          label: 'Trial effect',
          text: reading(result.trialEffect.amplitude, result.trialEffect.phaseDeg, amplitudeUnit),
        },
        {
          label: 'Influence coefficient',
          text: `${result.influenceCoefficient.amplitudePerMass.toPrecision(3)} ${influenceUnit(massUnit, amplitudeUnit)} at ${angleText(result.influenceCoefficient.phaseDeg)}`,
        },
      );
      return {
        corrections: [correction(1, title, result.correction, massUnit, placement(1))],
        heavySpotsDeg: [opposite(result.totalCorrection.angleDeg)],
        residuals: [
          {
            label: 'Predicted residual',
            text: reading(
              result.predictedResidual.amplitude,
              result.predictedResidual.phaseDeg,
              amplitudeUnit,
            ),
          },
        ],
        facts,
        warnings: [...result.warnings],
        weightsLeftOn: removed ? [] : [{ plane: 1, ...request.trialWeight }],
      };
    }
    case 'multi-plane': {
      const { result, request } = calculation;
      const lastRun = request.runs[request.runs.length - 1];
      const leftOn = lastRun !== undefined && lastRun.weights.length > 1 ? lastRun.weights : [];
      return {
        corrections: correctionsToInstall(calculation).map((weight) =>
          correction(
            weight.plane,
            leftOn.length > 0
              ? `Plane ${weight.plane}: add to the trial weight`
              : `Plane ${weight.plane} correction`,
            weight,
            massUnit,
            placement(weight.plane),
          ),
        ),
        heavySpotsDeg: result.corrections.map((weight) => opposite(weight.angleDeg)),
        residuals: result.predictedResidual.map((one, sensor) => ({
          label: `Predicted residual, sensor ${sensor + 1}`,
          text: reading(one.amplitude, one.phaseDeg, amplitudeUnit),
        })),
        facts: [{ label: 'Condition number', text: result.conditionNumber.toPrecision(3) }],
        warnings: [...result.warnings],
        weightsLeftOn: leftOn.map(({ plane, mass, angleDeg }) => ({ plane, mass, angleDeg })),
      };
    }
    case 'four-run': {
      const { result } = calculation;
      return {
        corrections: [correction(1, 'Correction weight', result.correction, massUnit, placement(1))],
        heavySpotsDeg: [opposite(result.correction.angleDeg)],
        residuals: [],
        facts: [
          {
            label: 'Trial effect',
            text: `${formatAmplitude(result.trialEffect.amplitude, amplitudeUnit)}, adding most at ${angleText(result.trialEffect.angleDeg)}`,
          },
          { label: 'Disagreement between runs', text: `${(result.consistency * 100).toFixed(1)} %` },
        ],
        warnings: [...result.warnings],
        weightsLeftOn: [],
      };
    }
  }
}
