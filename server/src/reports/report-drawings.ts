/*
 * The report's drawings as SVG text for pdfmake's `svg` nodes: a polar plot of the readings before and
 * after, and an end view of each correction plane with the weights fitted. Pure functions of plain data,
 * so that the geometry is tested without building a PDF. Every angle is drawn from 0° at the top (the
 * reference mark), increasing the way the drawing says (`counting`, as the technician sees it).
 */

/** Which way angles increase on the drawing, as the technician sees it. */
export type Counting = 'clockwise' | 'counterClockwise';

/** A point of the drawing, in its own units (x right, y down). */
export interface Point {
  readonly x: number;
  readonly y: number;
}

const round = (value: number) => Math.round(value * 100) / 100;

/**
 * Where an angle lies on a circle of `radius` around `centre`: 0° at the top, increasing clockwise or
 * counter-clockwise. x = cx + s r sin θ, y = cy − r cos θ, with s = +1 clockwise, −1 counter-clockwise.
 */
export function pointAt(centre: Point, radius: number, angleDeg: number, counting: Counting): Point {
  const theta = (angleDeg * Math.PI) / 180;
  const sign = counting === 'clockwise' ? 1 : -1;
  return {
    x: round(centre.x + sign * radius * Math.sin(theta)),
    y: round(centre.y - radius * Math.cos(theta)),
  };
}

/** Text safe inside SVG markup. */
export function escapeXml(text: string): string {
  return text.replace(/[<>&"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

/**
 * A number as the report prints it: at most `significant` significant digits, no trailing zeros, never in
 * exponent form (below 0.0001 it is 0).
 */
export function formatFigure(value: number, significant = 3): string {
  if (!Number.isFinite(value)) return '–';
  const rounded = Number(value.toPrecision(significant));
  // A reading of a few ten-thousandths is nothing a meter shows: print it as 0, never as 5.55e-17.
  if (Math.abs(rounded) < 1e-4) return '0';
  return String(rounded);
}

/**
 * A "nice" full-scale value for a plot whose largest value is `max`: 1, 2 or 5 times a power of ten, at
 * least `max` (so that every point lies inside the outer ring).
 */
export function niceScale(max: number): number {
  if (!(max > 0) || !Number.isFinite(max)) return 1;
  const power = 10 ** Math.floor(Math.log10(max));
  for (const step of [1, 2, 5, 10]) if (step * power >= max) return step * power;
  return 10 * power;
}

const INK = '#1f2933';
const FAINT = '#9aa5b1';
const BEFORE = '#b54708';
const AFTER = '#175cd3';

/** The ticks every 30° and the angle labels every 90°, as SVG elements. */
function dialMarks(centre: Point, radius: number, counting: Counting, fontSize: number): string[] {
  const parts: string[] = [];
  for (let angle = 0; angle < 360; angle += 30) {
    const outer = pointAt(centre, radius, angle, counting);
    const inner = pointAt(centre, radius - (angle % 90 === 0 ? 7 : 4), angle, counting);
    parts.push(
      `<line x1="${inner.x}" y1="${inner.y}" x2="${outer.x}" y2="${outer.y}" stroke="${INK}" stroke-width="0.8"/>`,
    );
  }
  for (const angle of [90, 180, 270]) {
    const at = pointAt(centre, radius + fontSize * 0.9, angle, counting);
    parts.push(
      `<text x="${at.x}" y="${round(at.y + fontSize / 3)}" font-size="${fontSize}" text-anchor="middle" fill="${INK}">${angle}°</text>`,
    );
  }
  return parts;
}

/** The reference mark at 0°: a filled triangle just outside the rim, and its label. */
function referenceMark(centre: Point, radius: number, fontSize: number): string[] {
  const tip = { x: centre.x, y: round(centre.y - radius) };
  return [
    `<path d="M ${tip.x} ${tip.y} L ${round(tip.x - 5)} ${round(tip.y - 8)} L ${round(tip.x + 5)} ${round(tip.y - 8)} Z" fill="${INK}"/>`,
    `<text x="${tip.x}" y="${round(tip.y - 11)}" font-size="${fontSize}" text-anchor="middle" fill="${INK}">0° ref. mark</text>`,
  ];
}

/** One reading on the polar plot; `phaseDeg` null for a reading taken without phase. */
export interface PolarPoint {
  readonly label: string;
  readonly amplitude: number;
  readonly phaseDeg: number | null;
  readonly kind: 'before' | 'after';
}

/**
 * A polar plot of readings: rings at a quarter, half, three quarters and the full scale (a nice value at
 * least the largest amplitude, written with `unit`), 0° at the top, each reading an arrow from the centre
 * to (amplitude, phase) with its label, before in orange and after in blue. A reading without phase is a
 * dashed circle of its amplitude: it says how large, not where.
 */
export function polarPlotSvg(options: {
  readonly size: number;
  readonly unit: string;
  readonly counting: Counting;
  readonly points: readonly PolarPoint[];
}): string {
  const { size, counting } = options;
  const fontSize = Math.max(6, Math.round(size / 30));
  const centre = { x: size / 2, y: size / 2 + fontSize * 0.6 };
  const radius = size / 2 - fontSize * 3;
  const scale = niceScale(Math.max(0, ...options.points.map((point) => point.amplitude)));
  const parts: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${size}" height="${size}" viewBox="0 0 ${size} ${size}">`,
  ];
  for (const fraction of [0.25, 0.5, 0.75, 1]) {
    parts.push(
      `<circle cx="${centre.x}" cy="${centre.y}" r="${round(radius * fraction)}" fill="none" stroke="${fraction === 1 ? INK : FAINT}" stroke-width="${fraction === 1 ? 1 : 0.5}"/>`,
    );
  }
  parts.push(
    `<line x1="${round(centre.x - radius)}" y1="${centre.y}" x2="${round(centre.x + radius)}" y2="${centre.y}" stroke="${FAINT}" stroke-width="0.5"/>`,
    `<line x1="${centre.x}" y1="${round(centre.y - radius)}" x2="${centre.x}" y2="${round(centre.y + radius)}" stroke="${FAINT}" stroke-width="0.5"/>`,
  );
  parts.push(...dialMarks(centre, radius, counting, fontSize));
  parts.push(...referenceMark(centre, radius, fontSize));
  const ringLabel = pointAt(centre, radius, 135, 'clockwise');
  parts.push(
    `<text x="${round(ringLabel.x + 3)}" y="${round(ringLabel.y + fontSize)}" font-size="${fontSize}" fill="${INK}">${escapeXml(`${formatFigure(scale)} ${options.unit}`)}</text>`,
  );
  options.points.forEach((point, index) => {
    const colour = point.kind === 'before' ? BEFORE : AFTER;
    const r = (point.amplitude / scale) * radius;
    if (point.phaseDeg === null) {
      parts.push(
        `<circle cx="${centre.x}" cy="${centre.y}" r="${round(r)}" fill="none" stroke="${colour}" stroke-width="1.2" stroke-dasharray="3 2"/>`,
      );
      const at = pointAt(centre, r, 200 + index * 25, counting);
      parts.push(
        `<text x="${at.x}" y="${round(at.y + fontSize + 2)}" font-size="${fontSize}" text-anchor="middle" fill="${colour}">${escapeXml(point.label)}</text>`,
      );
      return;
    }
    const tip = pointAt(centre, r, point.phaseDeg, counting);
    parts.push(
      `<line x1="${centre.x}" y1="${centre.y}" x2="${tip.x}" y2="${tip.y}" stroke="${colour}" stroke-width="1.6"/>`,
      `<circle cx="${tip.x}" cy="${tip.y}" r="3" fill="${colour}"/>`,
    );
    // The label beyond the tip, or beside the centre when the arrow is too short to carry it.
    const label =
      r < fontSize * 2
        ? {
            x: round(centre.x + fontSize * 2.2),
            y: round(centre.y + (point.kind === 'before' ? -1 : 1) * fontSize),
          }
        : pointAt(centre, r + fontSize * 1.2, point.phaseDeg, counting);
    parts.push(
      `<text x="${label.x}" y="${round(label.y + fontSize / 3)}" font-size="${fontSize}" text-anchor="middle" fill="${colour}">${escapeXml(point.label)}</text>`,
    );
  });
  parts.push('</svg>');
  return parts.join('');
}

/** One weight on an end view. */
export interface EndViewWeight {
  readonly label: string;
  readonly angleDeg: number;
}

/**
 * The end view of one correction plane as the technician sees it from its side: the rim, ticks every
 * 30°, the reference mark at 0°, an arrow showing the rotation, and each weight as a dot on the rim with
 * its label just inside it (labels of weights closer than 25° are stepped inwards so that they do not sit
 * on each other).
 */
export function endViewSvg(options: {
  readonly size: number;
  readonly rotation: Counting;
  readonly counting: Counting;
  readonly weights: readonly EndViewWeight[];
}): string {
  const { size, counting } = options;
  const fontSize = Math.max(6, Math.round(size / 28));
  const centre = { x: size / 2, y: size / 2 + fontSize * 0.5 };
  const radius = size / 2 - fontSize * 3;
  const parts: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${size}" height="${size}" viewBox="0 0 ${size} ${size}">`,
    `<circle cx="${centre.x}" cy="${centre.y}" r="${round(radius)}" fill="#f5f7fa" stroke="${INK}" stroke-width="1.4"/>`,
    `<circle cx="${centre.x}" cy="${centre.y}" r="${round(radius * 0.12)}" fill="none" stroke="${FAINT}" stroke-width="0.8"/>`,
  ];
  parts.push(...dialMarks(centre, radius, counting, fontSize));
  parts.push(...referenceMark(centre, radius, fontSize));
  // The rotation: an arc inside the rim from 200° to 250° (on screen), with its head the way it turns.
  const arcRadius = radius * 0.55;
  const start = pointAt(centre, arcRadius, 210, 'clockwise');
  const end = pointAt(centre, arcRadius, 250, 'clockwise');
  const clockwise = options.rotation === 'clockwise';
  const [from, to] = clockwise ? [start, end] : [end, start];
  const sweep = clockwise ? 1 : 0;
  parts.push(
    `<path d="M ${from.x} ${from.y} A ${round(arcRadius)} ${round(arcRadius)} 0 0 ${sweep} ${to.x} ${to.y}" fill="none" stroke="${FAINT}" stroke-width="1.2"/>`,
  );
  const headAngle = clockwise ? 250 : 210;
  const outer = pointAt(centre, arcRadius + 4, clockwise ? 240 : 220, 'clockwise');
  const inner = pointAt(centre, arcRadius - 4, clockwise ? 240 : 220, 'clockwise');
  const head = pointAt(centre, arcRadius, headAngle, 'clockwise');
  parts.push(
    `<path d="M ${head.x} ${head.y} L ${outer.x} ${outer.y} L ${inner.x} ${inner.y} Z" fill="${FAINT}"/>`,
  );
  const sorted = [...options.weights]
    .map((weight, index) => ({ ...weight, index }))
    .sort((a, b) => a.angleDeg - b.angleDeg);
  let previousAngle = Number.NEGATIVE_INFINITY;
  let step = 0;
  for (const weight of sorted) {
    step = weight.angleDeg - previousAngle < 25 ? step + 1 : 0;
    previousAngle = weight.angleDeg;
    const dot = pointAt(centre, radius, weight.angleDeg, counting);
    // Inside the rim, where neither the angle labels nor the reference mark stand; close weights step inwards.
    const labelAt = pointAt(centre, radius - fontSize * (1.8 + step * 1.3), weight.angleDeg, counting);
    const anchor = 'middle';
    parts.push(
      `<line x1="${centre.x}" y1="${centre.y}" x2="${dot.x}" y2="${dot.y}" stroke="${AFTER}" stroke-width="0.6" stroke-dasharray="2 2"/>`,
      `<circle cx="${dot.x}" cy="${dot.y}" r="4.5" fill="${AFTER}" stroke="#ffffff" stroke-width="1"/>`,
      `<text x="${labelAt.x}" y="${round(labelAt.y + fontSize / 3)}" font-size="${fontSize}" text-anchor="${anchor}" fill="${AFTER}">${escapeXml(weight.label)}</text>`,
    );
  }
  parts.push('</svg>');
  return parts.join('');
}
