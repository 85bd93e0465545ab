import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { HttpProblem } from '../http/problem';
import { holdsDrawing, readSignature } from './signature';

/** A PNG data URL of raw RGBA pixels, with a text chunk that says where it was drawn. */
async function dataUrl(width: number, height: number, paint: (pixels: Buffer) => void): Promise<string> {
  const pixels = Buffer.alloc(width * height * 4);
  paint(pixels);
  const png = await sharp(pixels, { raw: { width, height, channels: 4 } })
    .png()
    .withMetadata({ exif: { IFD0: { ImageDescription: 'Drawn at 51.5072 N, 0.1276 W' } } })
    .toBuffer();
  return `data:image/png;base64,${png.toString('base64')}`;
}

describe('holdsDrawing', () => {
  it('sees ink on a transparent pad, or two colours on an opaque one, and nothing else', () => {
    const transparent = Buffer.alloc(4 * 4);
    expect(holdsDrawing(transparent, 4)).toBe(false);
    const ink = Buffer.from(transparent);
    ink[3] = 255;
    expect(holdsDrawing(ink, 4)).toBe(true);
    const white = Buffer.alloc(4 * 4, 255);
    expect(holdsDrawing(white, 4)).toBe(false);
    const whiteWithInk = Buffer.from(white);
    whiteWithInk.fill(0, 0, 3);
    expect(holdsDrawing(whiteWithInk, 4)).toBe(true);
  });
});

describe('readSignature', () => {
  it('keeps the drawing, encoded again as a PNG without what else the file carried', async () => {
    const url = await dataUrl(40, 20, (pixels) => {
      for (let x = 5; x < 35; x++) pixels[(10 * 40 + x) * 4 + 3] = 255;
    });
    const original = Buffer.from(url.slice(url.indexOf(',') + 1), 'base64');
    expect(original.includes('51.5072')).toBe(true);
    const kept = await readSignature(url);
    expect((await sharp(kept).metadata()).format).toBe('png');
    expect(kept.includes('51.5072')).toBe(false);
    const { data } = await sharp(kept).ensureAlpha().raw().toBuffer({ resolveWithObject: true });
    expect(holdsDrawing(data, 4)).toBe(true);
  });

  it('refuses a truncated PNG on signaturePng', async () => {
    const url = await dataUrl(40, 20, (pixels) => pixels.fill(255, 0, 400));
    const cut = Buffer.from(url.slice(url.indexOf(',') + 1), 'base64').subarray(0, 60);
    const refusal = await readSignature(`data:image/png;base64,${cut.toString('base64')}`).catch(
      (error: unknown) => error,
    );
    expect(refusal).toBeInstanceOf(HttpProblem);
    expect((refusal as HttpProblem).errors?.[0]?.path).toBe('signaturePng');
  });
});
