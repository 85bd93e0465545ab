import { createHash } from 'node:crypto';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { PhotoCalibrationSchema } from '@counterpoise/api';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_SEEDERS } from '../db/demo-seeders';
import { photos } from '../db/schema';
import { seedDemoData } from '../db/seed';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { PhotoStore } from './photo-store';

let temporary: TemporaryDatabase;
let dataDir: string;
let uploadsDir: string;

beforeAll(async () => {
  temporary = openTemporaryDatabase();
  dataDir = mkdtempSync(join(tmpdir(), 'counterpoise-demo-photos-'));
  uploadsDir = join(dataDir, 'photos-elsewhere');
  await seedDemoData(temporary.database, new Date('2026-05-04T08:00:00Z'), DEMO_SEEDERS, {
    dataDir,
    uploadsDir,
  });
}, 120_000);

afterAll(() => {
  temporary.dispose();
  rmSync(dataDir, { recursive: true, force: true });
});

describe('the demo photos', () => {
  it('puts two photos on a drum and one on its open job, the first the calibrated overlay background', () => {
    const rows = temporary.database.orm.select().from(photos).all();
    expect(rows).toHaveLength(3);
    expect(rows.filter((row) => row.machineId !== null)).toHaveLength(2);
    expect(rows.filter((row) => row.jobId !== null)).toHaveLength(1);
    const backgrounds = rows.filter((row) => row.overlayBackground);
    expect(backgrounds).toHaveLength(1);
    expect(PhotoCalibrationSchema.safeParse(backgrounds[0]!.calibration).success).toBe(true);
    expect(existsSync(join(dataDir, 'uploads'))).toBe(false);
  });

  it('stores each image and thumbnail under UPLOADS_DIR by the SHA-256 of its bytes, without metadata', async () => {
    const store = new PhotoStore(uploadsDir);
    for (const row of temporary.database.orm.select().from(photos).all()) {
      const image = readFileSync(store.pathOf(row.sha256, 'jpg'));
      expect(createHash('sha256').update(image).digest('hex')).toBe(row.sha256);
      expect(image.length).toBe(row.byteSize);
      const metadata = await sharp(image).metadata();
      expect([metadata.width, metadata.height, metadata.exif]).toEqual([
        row.widthPx,
        row.heightPx,
        undefined,
      ]);
      const thumbnail = await sharp(readFileSync(store.pathOf(row.thumbnailSha256, 'webp'))).metadata();
      expect(Math.max(thumbnail.width, thumbnail.height)).toBe(320);
    }
  });
});
