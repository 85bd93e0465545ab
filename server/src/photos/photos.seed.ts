import { join } from 'node:path';
import { and, eq } from 'drizzle-orm';
import sharp from 'sharp';
import { AccountsRepo } from '../accounts/accounts.repo';
import { DEMO_ORGANISATION } from '../auth/accounts.seed';
import type { Database } from '../db/database';
import { jobs, machines } from '../db/schema';
import type { PreparedDemoSeeder } from '../db/seed';
import { calibrationOf, type DemoPlateDrawing, endPlateSvg } from './demo-photos';
import { EXTENSIONS, type ProcessedPhoto, processPhoto } from './photo-image';
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

/**
 * Renders the drawings through the very pipeline an upload takes (an SVG drawn to a JPEG, then processed
 * as a photo), once per process: every seed of a test run reads the same images.
 */
let rendering: Promise<ProcessedPhoto[]> | undefined;
function render(): Promise<ProcessedPhoto[]> {
  rendering ??= Promise.all(
    DEMO_PHOTOS.map(async (photo) => {
      const jpeg = await sharp(Buffer.from(endPlateSvg(photo.drawing)))
        .jpeg({ quality: 90 })
        .toBuffer();
      return processPhoto(jpeg, 'image/jpeg');
    }),
  ).catch((error: unknown) => {
    rendering = undefined;
    throw error;
  });
  return rendering;
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
export const seedDemoPhotos: PreparedDemoSeeder = {
  async prepare(context) {
    const rendered = await render();
    const store = new PhotoStore(context.uploadsDir ?? join(context.dataDir, 'uploads'));
    for (const { image, thumbnail } of rendered) {
      await store.put(image.sha256, EXTENSIONS[image.mediaType], image.bytes);
      await store.put(thumbnail.sha256, EXTENSIONS[thumbnail.mediaType], thumbnail.bytes);
    }
    return (database, now) => insertDemoPhotos(database, now, rendered);
  },
};

function insertDemoPhotos(database: Database, now: Date, rendered: readonly ProcessedPhoto[]): void {
  const accounts = new AccountsRepo(database.orm);
  const organisation = accounts.findOrganisationByName(DEMO_ORGANISATION);
  const technician =
    organisation && accounts.listUsers(organisation.id).find((user) => user.role === 'technician');
  if (organisation === undefined || technician === undefined) {
    throw new Error(`The demo photos need ${DEMO_ORGANISATION} and its technician, seeded before them.`);
  }
  const repo = new PhotosRepo(database.orm);
  for (const [index, photo] of DEMO_PHOTOS.entries()) {
    const { image, thumbnail } = rendered[index]!;
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
      byteSize: image.bytes.length,
      caption: photo.caption,
      createdById: technician.id,
      createdAt: new Date(now.getTime() - (DEMO_PHOTOS.length - index) * 60_000),
    });
    if (photo.background) repo.setOverlayBackground(machineId, id, calibrationOf(photo.drawing));
  }
}
