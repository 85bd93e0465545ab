import { EngineError, requireFinite, requireNonNegative, requirePositive } from './errors';
import { angleDegOf, normalizeAngleDeg, validateWeight, type Weight } from './phasor';

/** N equally spaced positions (holes, teeth, holders) starting at `firstDeg`. */
export interface EqualPositions {
  count: number;
  firstDeg: number;
}

/** An allowed arc of the rotor, from `fromDeg` to `toDeg` counted the way angles increase. */
export interface AllowedSector {
  fromDeg: number;
  toDeg: number;
}

/** Input of {@link splitWeight}. */
export interface SplitWeightInput {
  weight: Weight;
  positionsDeg?: number[];
  positions?: EqualPositions;
  sectors?: AllowedSector[];
}

/** Result of {@link splitWeight}. */
export interface SplitWeightResult {
  weights: Weight[];
  /** Sum of the masses placed over the mass of the ideal weight (1 when no split was needed). */
  massRatio: number;
  warnings: string[];
}

/**
 * Splits a weight between the two allowed positions either side of it (law of sines on the vector triangle).
 * Formula: with the weight W at theta between positions a and b (gap g = b - a, 0 < g < 180),
 *   m_a = W sin(b - theta) / sin g,  m_b = W sin(theta - a) / sin g,
 * so that m_a e^(i a) + m_b e^(i b) = W e^(i theta). A weight already on a position, or inside an allowed
 * sector, is kept whole. Source: resolution of a vector along two directions (law of sines), as used for
 * splitting correction weights between blades or holes, e.g. R. B. McMillan, Rotating Machinery: Practical
 * Solutions to Unbalance and Misalignment (Fairmont Press, 2004), ch. 5 (vector methods); the result is
 * checked here by adding the two weights back as vectors.
 */
export function splitWeight(input: SplitWeightInput): SplitWeightResult {
  const w = validateWeight(input?.weight, 'weight');
  const theta = normalizeAngleDeg(w.angleDeg);
  const given = [input.positionsDeg, input.positions, input.sectors].filter((v) => v !== undefined).length;
  if (given !== 1) {
    throw new EngineError(
      'INVALID_INPUT',
      'Give the allowed places in one way: positionsDeg (a list of angles), positions (count and first angle) or sectors.',
      'positionsDeg',
    );
  }
  let candidates: number[];
  let field = 'positionsDeg';
  if (input.sectors !== undefined) {
    field = 'sectors';
    if (!Array.isArray(input.sectors) || input.sectors.length === 0) {
      throw new EngineError('INVALID_INPUT', 'List at least one allowed sector.', 'sectors');
    }
    candidates = [];
    for (let i = 0; i < input.sectors.length; i++) {
      const sec = input.sectors[i]!;
      const from = normalizeAngleDeg(requireFinite(sec?.fromDeg, `sectors[${i}].fromDeg`));
      const to = normalizeAngleDeg(requireFinite(sec?.toDeg, `sectors[${i}].toDeg`));
      if (normalizeAngleDeg(theta - from) <= normalizeAngleDeg(to - from)) {
        return { weights: [{ mass: w.mass, angleDeg: theta }], massRatio: 1, warnings: [] };
      }
      candidates.push(from, to);
    }
  } else if (input.positions !== undefined) {
    field = 'positions';
    const count = input.positions.count;
    if (typeof count !== 'number' || !Number.isInteger(count) || count < 2) {
      throw new EngineError(
        'INVALID_INPUT',
        'positions.count must be a whole number, 2 or more.',
        'positions.count',
      );
    }
    const first = requireFinite(input.positions.firstDeg, 'positions.firstDeg');
    candidates = [];
    for (let k = 0; k < count; k++) candidates.push(first + (360 * k) / count);
  } else {
    const list = input.positionsDeg!;
    if (!Array.isArray(list) || list.length === 0) {
      throw new EngineError('INVALID_INPUT', 'List at least one allowed position.', 'positionsDeg');
    }
    candidates = list.map((p, i) => requireFinite(p, `positionsDeg[${i}]`));
  }
  // Nearest position at or below theta (going backwards) and nearest strictly above it (going forwards).
  let below = NaN;
  let belowGap = Infinity;
  let above = NaN;
  let aboveGap = Infinity;
  for (const raw of candidates) {
    const p = normalizeAngleDeg(raw);
    const back = normalizeAngleDeg(theta - p);
    if (back < 1e-9 || back > 360 - 1e-9) {
      return { weights: [{ mass: w.mass, angleDeg: p }], massRatio: 1, warnings: [] };
    }
    if (back < belowGap) {
      belowGap = back;
      below = p;
    }
    const fwd = normalizeAngleDeg(p - theta);
    if (fwd < aboveGap) {
      aboveGap = fwd;
      above = p;
    }
  }
  const gap = belowGap + aboveGap;
  if (!(gap < 180 - 1e-9) || below === above) {
    throw new EngineError(
      'NO_SOLUTION',
      `The allowed places either side of ${theta.toFixed(1)} degrees are ${gap.toFixed(0)} degrees apart; two weights ` +
        'cannot make the correction unless they are less than 180 degrees apart. Allow a place nearer to the ideal angle.',
      field,
    );
  }
  const sg = Math.sin((gap * Math.PI) / 180);
  const ma = (w.mass * Math.sin((aboveGap * Math.PI) / 180)) / sg;
  const mb = (w.mass * Math.sin((belowGap * Math.PI) / 180)) / sg;
  const ratio = w.mass > 0 ? (ma + mb) / w.mass : 1;
  const warnings: string[] = [];
  if (ratio > 1.5) {
    warnings.push(
      `Splitting over places ${gap.toFixed(0)} degrees apart needs ${((ratio - 1) * 100).toFixed(0)} % more mass than one weight at the ideal angle.`,
    );
  }
  return {
    weights: [
      { mass: ma, angleDeg: below },
      { mass: mb, angleDeg: above },
    ],
    massRatio: ratio,
    warnings,
  };
}

/** A weight with an optional radius (in the caller's length unit). */
export interface RadialWeight {
  mass: number;
  angleDeg: number;
  radius?: number;
}

/** Input of {@link combineWeights}. */
export interface CombineWeightsInput {
  weights: RadialWeight[];
  /** Radius of the single weight; default the radius of the first weight. */
  radius?: number;
}

/** Result of {@link combineWeights}. */
export interface CombineWeightsResult {
  weight: RadialWeight;
  warnings: string[];
}

/**
 * Combines several weights into one that has the same unbalance.
 * Formula: U = sum m_k r_k e^(i theta_k); m = |U| / r, theta = arg U (radii omitted: all at one radius, r = 1).
 * Source: unbalance as the vector m r (ISO 21940-2 vocabulary; ISO 1940-1:2003 section 3, from memory).
 */
export function combineWeights(input: CombineWeightsInput): CombineWeightsResult {
  const list = input?.weights;
  if (!Array.isArray(list) || list.length === 0) {
    throw new EngineError('INVALID_INPUT', 'List at least one weight to combine.', 'weights');
  }
  const withRadius = list.filter((w) => w?.radius !== undefined).length;
  if (withRadius !== 0 && withRadius !== list.length) {
    throw new EngineError(
      'INVALID_INPUT',
      'Give a radius for every weight or for none (none means they all sit at the same radius).',
      'weights',
    );
  }
  let re = 0;
  let im = 0;
  list.forEach((raw, i) => {
    const w = validateWeight(raw, `weights[${i}]`);
    const r = withRadius ? requirePositive(raw.radius, `weights[${i}].radius`, 'radius') : 1;
    const a = (w.angleDeg * Math.PI) / 180;
    re += w.mass * r * Math.cos(a);
    im += w.mass * r * Math.sin(a);
  });
  const radius =
    input.radius !== undefined
      ? requirePositive(input.radius, 'radius', 'radius')
      : withRadius
        ? list[0]!.radius!
        : undefined;
  const u = Math.hypot(re, im);
  const mass = u / (radius ?? 1);
  const weight: RadialWeight = { mass, angleDeg: mass === 0 ? 0 : angleDegOf({ re, im }) };
  if (radius !== undefined) weight.radius = radius;
  return {
    weight,
    warnings: mass === 0 ? ['The weights cancel each other out; they can all be removed.'] : [],
  };
}

/** Input of {@link moveToRadius}. */
export interface MoveToRadiusInput {
  mass: number;
  fromRadius: number;
  toRadius: number;
}

/**
 * The mass that gives the same unbalance at another radius: m2 = m1 r1 / r2.
 * Source: unbalance U = m r (ISO 1940-1:2003, section 3, from memory).
 */
export function moveToRadius(input: MoveToRadiusInput): { mass: number } {
  const m = requireNonNegative(input?.mass, 'mass', 'mass');
  const r1 = requirePositive(input.fromRadius, 'fromRadius', 'radius');
  const r2 = requirePositive(input.toRadius, 'toRadius', 'radius');
  return { mass: (m * r1) / r2 };
}

/** Input of {@link suggestStockWeights}. */
export interface StockWeightsInput {
  /** The weight wanted (one place). */
  weight: Weight;
  /** Masses of the stock pieces the shop keeps, same unit as the weight. */
  stockMasses: number[];
  /** Most pieces stacked in one place; default 3. */
  maxPieces?: number;
}

/** Result of {@link suggestStockWeights}. */
export interface StockWeightsResult {
  /** The pieces to fit, each at the weight's angle. */
  pieces: Weight[];
  placed: Weight;
  /** What the pieces leave uncorrected, as a weight: wanted - placed. */
  residual: Weight;
  warnings: string[];
}

/**
 * The nearest combination of stock weights for a wanted weight, and the residual it leaves.
 * Chooses, among all multisets of at most `maxPieces` stock pieces, the one whose total mass is nearest the
 * wanted mass (ties: fewer pieces). Residual = (wanted - placed) at the wanted angle, or opposite when
 * the pieces weigh more. Source: exhaustive search; the residual is the vector difference of two collinear weights.
 */
export function suggestStockWeights(input: StockWeightsInput): StockWeightsResult {
  const w = validateWeight(input?.weight, 'weight');
  const stock = input.stockMasses;
  if (!Array.isArray(stock) || stock.length === 0) {
    throw new EngineError('INVALID_INPUT', 'List the stock weight sizes the shop keeps.', 'stockMasses');
  }
  const sizes = stock.map((s, i) => requirePositive(s, `stockMasses[${i}]`, 'stock weight'));
  const maxPieces = input.maxPieces ?? 3;
  if (!Number.isInteger(maxPieces) || maxPieces < 1 || maxPieces > 6) {
    throw new EngineError('INVALID_INPUT', 'maxPieces must be a whole number from 1 to 6.', 'maxPieces');
  }
  sizes.sort((a, b) => a - b);
  let best: number[] = [];
  let bestErr = w.mass;
  const current: number[] = [];
  const search = (start: number, total: number): void => {
    const err = Math.abs(w.mass - total);
    if (err < bestErr - 1e-12 || (Math.abs(err - bestErr) <= 1e-12 && current.length < best.length)) {
      bestErr = err;
      best = current.slice();
    }
    if (current.length === maxPieces) return;
    for (let i = start; i < sizes.length; i++) {
      current.push(sizes[i]!);
      search(i, total + sizes[i]!);
      current.pop();
    }
  };
  search(0, 0);
  const angle = normalizeAngleDeg(w.angleDeg);
  const placedMass = best.reduce((a, b) => a + b, 0);
  const diff = w.mass - placedMass;
  const warnings: string[] = [];
  if (best.length === 0 && w.mass > 0)
    warnings.push('Every stock weight is heavier than needed; no weight is suggested.');
  return {
    pieces: best.map((m) => ({ mass: m, angleDeg: angle })),
    placed: { mass: placedMass, angleDeg: angle },
    residual: { mass: Math.abs(diff), angleDeg: diff >= 0 ? angle : normalizeAngleDeg(angle + 180) },
    warnings,
  };
}
