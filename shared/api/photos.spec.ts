import { describe, expect, it } from 'vitest';
import { ChangePhotoSchema, PhotoCalibrationSchema, PhotoUploadFieldsSchema } from './photos';

const CALIBRATION = {
  centre: { x: 0.5, y: 0.52 },
  rim: { x: 0.82, y: 0.52 },
  referenceMark: { x: 0.5, y: 0.2 },
};

describe('a photo’s calibration', () => {
  it('takes points inside the photo with the rim and the mark away from the centre', () => {
    expect(PhotoCalibrationSchema.parse(CALIBRATION)).toEqual(CALIBRATION);
    expect(PhotoCalibrationSchema.safeParse({ ...CALIBRATION, rim: { x: 1, y: 0 } }).success).toBe(true);
  });

  it('names the point outside the photo, and the one on the centre', () => {
    const outside = PhotoCalibrationSchema.safeParse({ ...CALIBRATION, centre: { x: -0.01, y: 0.5 } });
    expect(outside.error?.issues.map((issue) => issue.path.join('.'))).toEqual(['centre.x']);
    const onCentre = PhotoCalibrationSchema.safeParse({
      ...CALIBRATION,
      rim: { x: 0.51, y: 0.52 },
      referenceMark: { x: 0.5, y: 0.53 },
    });
    expect(onCentre.error?.issues.map((issue) => [issue.path.join('.'), issue.message])).toEqual([
      ['rim', 'The rim is on the centre: drag it out to the circle where weights go.'],
      ['referenceMark', 'The reference mark is on the centre: drag it to the mark on the rotor.'],
    ]);
  });
});

describe('a caption', () => {
  it('is trimmed, empty meaning none, and refuses hidden characters and length', () => {
    expect(ChangePhotoSchema.parse({ caption: '  Left end  ' })).toEqual({ caption: 'Left end' });
    expect(ChangePhotoSchema.parse({ caption: '   ' })).toEqual({ caption: null });
    expect(ChangePhotoSchema.parse({ caption: null })).toEqual({ caption: null });
    expect(ChangePhotoSchema.safeParse({ caption: 'Left\u202Eend' }).success).toBe(false);
    expect(ChangePhotoSchema.safeParse({ caption: 'x'.repeat(201) }).success).toBe(false);
  });

  it('is the only text field an upload takes', () => {
    expect(PhotoUploadFieldsSchema.parse({ caption: 'Hub' })).toEqual({ caption: 'Hub' });
    expect(PhotoUploadFieldsSchema.parse({})).toEqual({});
    const extra = PhotoUploadFieldsSchema.safeParse({ caption: 'Hub', gps: '47.6,8.5' });
    expect(extra.error?.issues[0]?.message).toBe('Send only `photo` and `caption`.');
  });
});
