/*
 * The demo scenario's photos: drawings of our own of a mulcher drum's end plate, seen end on, as a
 * technician would photograph it on the tailgate (invented; no real machine). Each is an SVG drawn here and
 * turned into an image by the same pipeline an upload goes through.
 */

/** Where things are on a drawing, in its pixels. */
export const DEMO_PHOTO_SIZE = { widthPx: 1600, heightPx: 1200 } as const;

/** How one drawing looks: where the plate sits, where the tape is, how dirty it is. */
export interface DemoPlateDrawing {
  readonly centreX: number;
  readonly centreY: number;
  /** The radius of the circle where weights go (the plate's outer ring, inside the teeth). */
  readonly weightRadius: number;
  /** The tape's angle, clockwise from 12 o'clock. */
  readonly tapeDeg: number;
  /** Soil caked on the plate, 0 (clean) to 1. */
  readonly soil: number;
  /** Wire wrapped round the hub. */
  readonly wrappedWire?: boolean;
}

function polar(cx: number, cy: number, radius: number, deg: number): [number, number] {
  const rad = (deg * Math.PI) / 180;
  return [cx + radius * Math.sin(rad), cy - radius * Math.cos(rad)];
}

const round = (value: number) => Math.round(value * 10) / 10;

/** The SVG of one drawing. */
export function endPlateSvg(drawing: DemoPlateDrawing): string {
  const { widthPx, heightPx } = DEMO_PHOTO_SIZE;
  const { centreX: cx, centreY: cy, weightRadius: r } = drawing;
  const plate = r + 40;
  const teeth = Array.from({ length: 12 }, (_, index) => {
    const deg = 15 + index * 30;
    const [x, y] = polar(cx, cy, plate + 30, deg);
    return `<rect x="${round(x - 26)}" y="${round(y - 44)}" width="52" height="88" rx="8" fill="#3c3f44" stroke="#1d1f22" stroke-width="5" transform="rotate(${deg} ${round(x)} ${round(y)})"/>`;
  }).join('');
  const bolts = Array.from({ length: 6 }, (_, index) => {
    const [x, y] = polar(cx, cy, 92, index * 60);
    return `<circle cx="${round(x)}" cy="${round(y)}" r="14" fill="#9aa0a6" stroke="#2b2e31" stroke-width="4"/>`;
  }).join('');
  const soil = Array.from({ length: Math.round(drawing.soil * 14) }, (_, index) => {
    const [x, y] = polar(cx, cy, 150 + ((index * 97) % (r - 170)), index * 47 + 10);
    return `<ellipse cx="${round(x)}" cy="${round(y)}" rx="${40 + ((index * 31) % 50)}" ry="${22 + ((index * 17) % 30)}" fill="#6b4f33" opacity="0.85"/>`;
  }).join('');
  const [tx, ty] = polar(cx, cy, r, drawing.tapeDeg);
  const wire = drawing.wrappedWire
    ? `<g fill="none" stroke="#b8b2a2" stroke-width="5" opacity="0.9">${[0, 1, 2, 3]
        .map(
          (n) => `<ellipse cx="${cx + 6 * n}" cy="${cy - 4 * n}" rx="${150 + 9 * n}" ry="${138 + 7 * n}"/>`,
        )
        .join('')}</g>`
    : '';
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${widthPx}" height="${heightPx}" viewBox="0 0 ${widthPx} ${heightPx}">
  <defs>
    <linearGradient id="ground" x1="0" y1="0" x2="0" y2="1">
      <stop offset="0" stop-color="#5d7048"/><stop offset="0.55" stop-color="#48553a"/><stop offset="1" stop-color="#5a4a36"/>
    </linearGradient>
    <radialGradient id="steel" cx="0.42" cy="0.38" r="0.75">
      <stop offset="0" stop-color="#c9ccce"/><stop offset="0.6" stop-color="#8d9296"/><stop offset="1" stop-color="#5d6266"/>
    </radialGradient>
    <radialGradient id="hub" cx="0.4" cy="0.35" r="0.8">
      <stop offset="0" stop-color="#e3c25a"/><stop offset="1" stop-color="#a3801f"/>
    </radialGradient>
  </defs>
  <rect width="100%" height="100%" fill="url(#ground)"/>
  <rect x="0" y="${cy + plate - 10}" width="${widthPx}" height="${heightPx}" fill="#3f3428" opacity="0.6"/>
  <rect x="${cx - plate - 120}" y="${cy - 40}" width="${2 * plate + 240}" height="80" fill="#2f3235" opacity="0.55"/>
  ${teeth}
  <circle cx="${cx}" cy="${cy}" r="${plate}" fill="url(#steel)" stroke="#2b2e31" stroke-width="8"/>
  <circle cx="${cx}" cy="${cy}" r="${r}" fill="none" stroke="#6f7478" stroke-width="6" stroke-dasharray="4 10"/>
  <circle cx="${cx}" cy="${cy}" r="${r - 60}" fill="none" stroke="#7d8286" stroke-width="3"/>
  ${soil}
  <circle cx="${cx}" cy="${cy}" r="130" fill="url(#hub)" stroke="#5c4710" stroke-width="6"/>
  ${bolts}
  <circle cx="${cx}" cy="${cy}" r="46" fill="#3a3d40" stroke="#1d1f22" stroke-width="5"/>
  ${wire}
  <rect x="${round(tx - 16)}" y="${round(ty - 40)}" width="32" height="80" fill="#f4f6f0" stroke="#c9c9c0" stroke-width="3" transform="rotate(${drawing.tapeDeg} ${round(tx)} ${round(ty)})"/>
</svg>`;
}

/** The calibration that fits a drawing: its centre, a point on its weight circle, and its tape. */
export function calibrationOf(drawing: DemoPlateDrawing) {
  const { widthPx, heightPx } = DEMO_PHOTO_SIZE;
  const point = ([x, y]: [number, number]) => ({
    x: Math.round((x / widthPx) * 10_000) / 10_000,
    y: Math.round((y / heightPx) * 10_000) / 10_000,
  });
  return {
    centre: point([drawing.centreX, drawing.centreY]),
    rim: point(polar(drawing.centreX, drawing.centreY, drawing.weightRadius, 90)),
    referenceMark: point(polar(drawing.centreX, drawing.centreY, drawing.weightRadius, drawing.tapeDeg)),
  };
}
