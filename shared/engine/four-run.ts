import { EngineError, requireFinite, requireNonNegative, requirePositive } from './errors';
import { normalizeAngleDeg } from './phasor';

/** One run with the trial weight at a position: its angle and the amplitude read (no phase). */
export interface AmplitudeRun {
  angleDeg: number;
  amplitude: number;
}

/** Input of {@link fourRunBalance}. */
export interface FourRunInput {
  initialAmplitude: number;
  trialMass: number;
  /** Three or more runs with the same trial weight at different angles (typically 0, 120, 240). */
  trialRuns: AmplitudeRun[];
  /** consistency above this raises a warning; default 0.1 (product default). */
  maxInconsistency?: number;
}

/** Result of {@link fourRunBalance}. */
export interface FourRunResult {
  correction: { mass: number; angleDeg: number };
  /** Amplitude the trial weight alone causes, and the angle where it adds straight to the initial vibration. */
  trialEffect: { amplitude: number; angleDeg: number };
  /**
   * RMS misfit of the amplitudes as a fraction of the initial amplitude: 0 when the three circles of the
   * graphical method meet in one point; larger when the readings disagree.
   */
  consistency: number;
  /** Amplitude each trial run should have shown under the fitted model, in the order given. */
  fittedAmplitudes: number[];
  warnings: string[];
}

/**
 * Amplitude-only balancing: the four-run method (initial run, then the trial weight at three or more angles).
 * Model: with O the initial amplitude, T the amplitude of the trial weight's effect and delta the rotor angle
 * at which that effect adds straight to O, a trial run at angle theta_j reads
 *   A_j^2 = O^2 + T^2 + 2 O T cos(theta_j - delta).
 * Writing p = 2 O T cos(delta), q = 2 O T sin(delta), x = T^2 gives the linear system
 *   A_j^2 - O^2 = x + p cos(theta_j) + q sin(theta_j),
 * solved by least squares for a start; (T, delta) are then refined by Gauss-Newton on the amplitude residuals.
 * Correction: mass = m_trial O / T at angle delta + 180 degrees.
 * Source: the graphical construction of the three circles in R. B. McMillan, Rotating Machinery: Practical
 * Solutions to Unbalance and Misalignment (Fairmont Press, 2004), ch. 6, eq. (6.2)
 * "correction weight = trial weight x O / T"; the algebra above is the law of cosines on that construction.
 * Published examples checked in tests/reference: D. Shreve, "Balancing Without Phase" (Reliabilityweb.com), and
 * the three application cases of M.-H. Bui, D.-H. Dinh, P.-V. Dang (four-run reproducibility package v3.0).
 */
export function fourRunBalance(input: FourRunInput): FourRunResult {
  const o = requireNonNegative(input?.initialAmplitude, 'initialAmplitude', 'vibration amplitude');
  const mt = requirePositive(input.trialMass, 'trialMass', 'trial mass');
  const runs = input.trialRuns;
  if (!Array.isArray(runs) || runs.length < 3) {
    throw new EngineError(
      'TOO_FEW_RUNS',
      `Amplitude-only balancing needs the trial weight at three positions at least; there are ${Array.isArray(runs) ? runs.length : 0}.`,
      'trialRuns',
    );
  }
  const maxInc = input.maxInconsistency ?? 0.1;
  const n = runs.length;
  const th = new Float64Array(n);
  const amp = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    const run = runs[j];
    if (!run || typeof run !== 'object') {
      throw new EngineError('INVALID_INPUT', `Trial run ${j + 1} is missing.`, `trialRuns[${j}]`);
    }
    th[j] = (requireFinite(run.angleDeg, `trialRuns[${j}].angleDeg`) * Math.PI) / 180;
    amp[j] = requireNonNegative(run.amplitude, `trialRuns[${j}].amplitude`, 'vibration amplitude');
  }
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      if (Math.abs(normalizeAngleDeg(((th[i]! - th[j]!) * 180) / Math.PI + 180) - 180) < 1e-6 && n === 3) {
        throw new EngineError(
          'INVALID_INPUT',
          `Trial runs ${i + 1} and ${j + 1} have the trial weight at the same angle; use three different positions (e.g. 0, 120, 240).`,
          `trialRuns[${j}].angleDeg`,
        );
      }
    }
  }
  if (o === 0) {
    return {
      correction: { mass: 0, angleDeg: 0 },
      trialEffect: { amplitude: 0, angleDeg: 0 },
      consistency: 0,
      fittedAmplitudes: Array.from(amp),
      warnings: ['The initial amplitude is zero: no correction is needed.'],
    };
  }
  // Normal equations of the linear start; 3 x 3, well conditioned when the angles are spread round the rotor.
  const ata = [0, 0, 0, 0, 0, 0, 0, 0, 0];
  const aty = [0, 0, 0];
  for (let j = 0; j < n; j++) {
    const row = [1, Math.cos(th[j]!), Math.sin(th[j]!)];
    const y = amp[j]! * amp[j]! - o * o;
    for (let r = 0; r < 3; r++) {
      aty[r]! += row[r]! * y;
      for (let c = 0; c < 3; c++) ata[r * 3 + c]! += row[r]! * row[c]!;
    }
  }
  const sol = solve3(ata, aty);
  if (!sol) {
    throw new EngineError(
      'INVALID_INPUT',
      'The trial positions are too close together to locate the unbalance; spread them round the rotor (e.g. 0, 120, 240).',
      'trialRuns',
    );
  }
  const [x, p, q] = sol;
  let t = Math.hypot(p, q) / (2 * o);
  if (x > 0) t = 0.5 * (t + Math.sqrt(x));
  let delta = Math.atan2(q, p);
  const scaleRef = Math.max(o, ...amp);
  if (!(t > 1e-9 * scaleRef)) {
    throw new EngineError(
      'ZERO_TRIAL_EFFECT',
      'The trial weight did not change the amplitude at any position, so its effect cannot be measured. Use a larger trial weight.',
      'trialRuns',
    );
  }
  // Gauss-Newton with step halving on r_j = A_j - sqrt(O^2 + T^2 + 2 O T cos(theta_j - delta)).
  let cost = costOf(o, t, delta, th, amp);
  for (let iter = 0; iter < 50; iter++) {
    let g11 = 0;
    let g12 = 0;
    let g22 = 0;
    let b1 = 0;
    let b2 = 0;
    for (let j = 0; j < n; j++) {
      const c = Math.cos(th[j]! - delta);
      const sn = Math.sin(th[j]! - delta);
      const model = Math.sqrt(Math.max(o * o + t * t + 2 * o * t * c, 1e-300));
      const r = amp[j]! - model;
      const dT = (t + o * c) / model;
      const dD = (o * t * sn) / model;
      g11 += dT * dT;
      g12 += dT * dD;
      g22 += dD * dD;
      b1 += dT * r;
      b2 += dD * r;
    }
    const det = g11 * g22 - g12 * g12;
    if (!(Math.abs(det) > 1e-300)) break;
    let stepT = (g22 * b1 - g12 * b2) / det;
    let stepD = (g11 * b2 - g12 * b1) / det;
    let improved = false;
    for (let half = 0; half < 30; half++) {
      const nt = t + stepT;
      const nd = delta + stepD;
      const nc = nt > 0 ? costOf(o, nt, nd, th, amp) : Infinity;
      if (nc < cost) {
        t = nt;
        delta = nd;
        improved = cost - nc > 1e-15 * (cost + 1e-300);
        cost = nc;
        break;
      }
      stepT /= 2;
      stepD /= 2;
    }
    if (!improved) break;
  }
  const fitted: number[] = [];
  for (let j = 0; j < n; j++)
    fitted.push(Math.sqrt(Math.max(o * o + t * t + 2 * o * t * Math.cos(th[j]! - delta), 0)));
  const consistency = Math.sqrt(cost / n) / o;
  const deltaDeg = normalizeAngleDeg((delta * 180) / Math.PI);
  const warnings: string[] = [];
  if (consistency > maxInc) {
    warnings.push(
      `The trial runs do not agree with one another (misfit ${(consistency * 100).toFixed(0)} % of the initial amplitude): ` +
        'the readings may be unsteady or the trial weight may have moved. Repeat the runs before fitting a weight.',
    );
  }
  if (t < 0.1 * o) {
    warnings.push(
      'The trial weight changed the amplitude very little; a larger trial weight gives a more reliable answer.',
    );
  }
  return {
    correction: { mass: (mt * o) / t, angleDeg: normalizeAngleDeg(deltaDeg + 180) },
    trialEffect: { amplitude: t, angleDeg: deltaDeg },
    consistency,
    fittedAmplitudes: fitted,
    warnings,
  };
}

function costOf(o: number, t: number, delta: number, th: Float64Array, amp: Float64Array): number {
  let sum = 0;
  for (let j = 0; j < th.length; j++) {
    const model = Math.sqrt(Math.max(o * o + t * t + 2 * o * t * Math.cos(th[j]! - delta), 0));
    const r = amp[j]! - model;
    sum += r * r;
  }
  return sum;
}

function solve3(m: number[], b: number[]): [number, number, number] | undefined {
  const a = m.slice();
  const y = b.slice();
  let scale = 0;
  for (const v of a) scale = Math.max(scale, Math.abs(v));
  for (let col = 0; col < 3; col++) {
    let piv = col;
    for (let r = col + 1; r < 3; r++) if (Math.abs(a[r * 3 + col]!) > Math.abs(a[piv * 3 + col]!)) piv = r;
    if (!(Math.abs(a[piv * 3 + col]!) > 1e-10 * scale)) return undefined;
    if (piv !== col) {
      for (let c = 0; c < 3; c++) {
        const tmp = a[col * 3 + c]!;
        a[col * 3 + c] = a[piv * 3 + c]!;
        a[piv * 3 + c] = tmp;
      }
      const tmp = y[col]!;
      y[col] = y[piv]!;
      y[piv] = tmp;
    }
    for (let r = col + 1; r < 3; r++) {
      const f = a[r * 3 + col]! / a[col * 3 + col]!;
      for (let c = col; c < 3; c++) a[r * 3 + c]! -= f * a[col * 3 + c]!;
      y[r]! -= f * y[col]!;
    }
  }
  const x = [0, 0, 0];
  for (let r = 2; r >= 0; r--) {
    let s = y[r]!;
    for (let c = r + 1; c < 3; c++) s -= a[r * 3 + c]! * x[c]!;
    x[r] = s / a[r * 3 + r]!;
  }
  return [x[0]!, x[1]!, x[2]!];
}
