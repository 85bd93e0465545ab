/**
 * The plain data the correction-location overlay draws. Angles are rotor angles in degrees, counted from the
 * reference mark the way the overlay's `counting` says; photo points are fractions of the image (0..1).
 */

/** A weight to draw: a correction to fit, or one already on the rotor. */
export interface OverlayWeight {
  /** The mass, in `unit`. */
  readonly mass: number;
  /** Where it goes, in degrees from the reference mark. */
  readonly angleDeg: number;
  /** The unit of the mass, as shown: "g", "oz". */
  readonly unit: string;
  /** A short name shown before the mass, e.g. "Split A". */
  readonly label?: string;
}

/** A stretch of the rim where no weight can go (a tooth holder, a weld, a bolt head), `fromDeg` to `toDeg` the way angles increase. */
export interface BlockedSector {
  /** Where the sector starts, in degrees. */
  readonly fromDeg: number;
  /** Where the sector ends, in degrees, counted on from `fromDeg` the way angles increase. */
  readonly toDeg: number;
  /** What blocks it, in a word or two: "holder", "weld". */
  readonly label: string;
}

/** A point on a photo, as fractions of the image's width (`x`) and height (`y`), from its top-left corner. */
export interface PhotoPoint {
  /** Across, from the left edge (0) to the right edge (1). */
  readonly x: number;
  /** Down, from the top edge (0) to the bottom edge (1). */
  readonly y: number;
}

/** Where the rotor is on a photo: its centre, a point on its rim, and the reference mark. */
export interface PhotoCalibration {
  /** The centre of the rotor (the shaft). */
  readonly centre: PhotoPoint;
  /** A point on the circle where weights go; its distance from the centre sets the drawing's radius. */
  readonly rim: PhotoPoint;
  /** The reference mark; its direction from the centre is where 0 degrees is drawn. */
  readonly referenceMark: PhotoPoint;
}

/** A photo of the technician's own rotor, seen end on, to draw over. */
export interface RotorPhoto {
  /** The image URL (an object URL or a data URL from the tablet's camera works too). */
  readonly src: string;
  /** Where the rotor sits on the photo; without it the drawing is centred on the photo. */
  readonly calibration?: PhotoCalibration;
  /** Width divided by height; read from the image when omitted. */
  readonly aspectRatio?: number;
}

/** A point on the rotor: an angle, and a distance from the centre as a fraction of the drawn radius. */
export interface OverlayPoint {
  /** The rotor angle, in whole degrees from the reference mark. */
  readonly angleDeg: number;
  /** The distance from the centre, as a fraction of the radius (1 on the rim). */
  readonly radiusFraction: number;
}

/** The three calibration handles. */
export type CalibrationHandle = 'centre' | 'rim' | 'referenceMark';

/** The calibration handles, in the order they are offered. */
export const CALIBRATION_HANDLES: readonly CalibrationHandle[] = ['centre', 'rim', 'referenceMark'];
