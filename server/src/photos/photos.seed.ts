import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { readFileSync, renameSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { and, eq } from 'drizzle-orm';
import type { PhotoMediaType } from '@counterpoise/api';
import { AccountsRepo } from '../accounts/accounts.repo';
import { DEMO_ORGANISATION } from '../auth/accounts.seed';
import type { Database } from '../db/database';
import { jobs, machines } from '../db/schema';
import type { DemoSeeder } from '../db/seed';
import { calibrationOf, type DemoPlateDrawing, endPlateSvg } from './demo-photos';
import { EXTENSIONS } from './photo-image';
import { PhotoStore } from './photo-store';
import { PhotosRepo } from './photos.repo';

/** One demo photo: on a machine (by serial) or on that machine's open job, with its caption. */
interface DemoPhoto {
  readonly serialNumber: string;
  readonly onJob: boolean;
  readonly caption: string;
  readonly drawing: DemoPlateDrawing;
  /** The machine's overlay background, calibrated on the drawing. */
  readonly background?: boolean;
}

const DEMO_PHOTOS: readonly DemoPhoto[] = [
  {
    serialNumber: 'BF250-00921',
    onJob: false,
    caption: 'Left end plate, cleaned; tape beside the first tooth row',
    drawing: { centreX: 800, centreY: 610, weightRadius: 400, tapeDeg: 15, soil: 0.1 },
    background: true,
  },
  {
    serialNumber: 'BF250-00921',
    onJob: false,
    caption: 'Right end plate before cleaning',
    drawing: { centreX: 760, centreY: 630, weightRadius: 390, tapeDeg: 200, soil: 0.9 },
  },
  {
    serialNumber: 'BF250-00921',
    onJob: true,
    caption: 'As found: wire wrapped round the left hub',
    drawing: { centreX: 820, centreY: 600, weightRadius: 400, tapeDeg: 15, soil: 0.6, wrappedWire: true },
  },
];

interface RenderedImage {
  readonly bytes: string;
  readonly sha256: string;
  readonly mediaType: PhotoMediaType;
  readonly widthPx: number;
  readonly heightPx: number;
}

/** The repository's root, where `node --import tsx` finds tsx. */
const ROOT = fileURLToPath(new URL('../../..', import.meta.url));
const RENDER_SCRIPT = fileURLToPath(new URL('./demo-photos.render.ts', import.meta.url));
const IMAGE_PIPELINE = fileURLToPath(new URL('./photo-image.ts', import.meta.url));

interface RenderedPhoto {
  readonly image: RenderedImage;
  readonly thumbnail: RenderedImage;
}

/**
 * Renders the drawings through the upload pipeline, in a child process (see demo-photos.render.ts). The
 * result is kept in the system's temporary folder, named by the hash of the drawings and of the code that
 * renders them, so that seeding again (every test that seeds, every fresh demo) reads it instead of
 * rendering it again; what a seed stores is the same either way.
 */
function render(svgs: readonly string[]): RenderedPhoto[] {
  const key = createHash('sha256')
    .update(JSON.stringify(svgs))
    .update(readFileSync(RENDER_SCRIPT))
    .update(readFileSync(IMAGE_PIPELINE))
    .digest('hex')
    .slice(0, 32);
  const cached = join(tmpdir(), `counterpoise-demo-photos-${key}.json`);
  try {
    return JSON.parse(readFileSync(cached, 'utf8')) as RenderedPhoto[];
  } catch {
    // Not rendered yet on this machine (or unreadable): render it now.
  }
  const output = execFileSync(process.execPath, ['--import', 'tsx', RENDER_SCRIPT], {
    cwd: ROOT,
    input: JSON.stringify(svgs),
    maxBuffer: 64 * 1024 * 1024,
    timeout: 60_000,
  });
  const temporary = `${cached}.${process.pid}.tmp`;
  writeFileSync(temporary, output, { mode: 0o600 });
  renameSync(temporary, cached);
  return JSON.parse(output.toString('utf8')) as RenderedPhoto[];
}

function findMachine(database: Database, organisationId: number, serialNumber: string): number {
  const machine = database.orm
    .select({ id: machines.id })
    .from(machines)
    .where(and(eq(machines.organisationId, organisationId), eq(machines.serialNumber, serialNumber)))
    .get();
  if (!machine) throw new Error(`The demo photos name the machine ${serialNumber}, not seeded.`);
  return machine.id;
}

function openJobOf(database: Database, machineId: number): number {
  const job = database.orm
    .select({ id: jobs.id })
    .from(jobs)
    .where(and(eq(jobs.machineId, machineId), eq(jobs.status, 'open')))
    .get();
  if (!job) throw new Error(`The demo photos need an open job on machine ${machineId}, seeded before them.`);
  return job.id;
}

/**
 * Adds the demo photos: two of a mulcher drum's end plates on its machine, the first its overlay background,
 * calibrated on the drawing; one of the rotor as found on the machine's open job. Files go under the
 * uploads folder like any upload's.
 */
export const seedDemoPhotos: DemoSeeder = (database, now, context) => {
  const accounts = new AccountsRepo(database.orm);
  const organisation = accounts.findOrganisationByName(DEMO_ORGANISATION);
  const technician =
    organisation && accounts.listUsers(organisation.id).find((user) => user.role === 'technician');
  if (organisation === undefined || technician === undefined) {
    throw new Error(`The demo photos need ${DEMO_ORGANISATION} and its technician, seeded before them.`);
  }
  const store = new PhotoStore(context.uploadsDir ?? join(context.dataDir, 'uploads'));
  const repo = new PhotosRepo(database.orm);
  const rendered = render(DEMO_PHOTOS.map((photo) => endPlateSvg(photo.drawing)));
  for (const [index, photo] of DEMO_PHOTOS.entries()) {
    const { image, thumbnail } = rendered[index]!;
    store.putSync(image.sha256, EXTENSIONS[image.mediaType], Buffer.from(image.bytes, 'base64'));
    store.putSync(thumbnail.sha256, 'webp', Buffer.from(thumbnail.bytes, 'base64'));
    const machineId = findMachine(database, organisation.id, photo.serialNumber);
    const id = repo.insert({
      organisationId: organisation.id,
      machineId: photo.onJob ? null : machineId,
      jobId: photo.onJob ? openJobOf(database, machineId) : null,
      sha256: image.sha256,
      thumbnailSha256: thumbnail.sha256,
      mediaType: image.mediaType,
      widthPx: image.widthPx,
      heightPx: image.heightPx,
      byteSize: Buffer.byteLength(image.bytes, 'base64'),
      caption: photo.caption,
      createdById: technician.id,
      createdAt: new Date(now.getTime() - (DEMO_PHOTOS.length - index) * 60_000),
    });
    if (photo.background) repo.setOverlayBackground(machineId, id, calibrationOf(photo.drawing));
  }
};
