import {
  can,
  JOBS_PROBLEM_CODES,
  type Photo,
  type PhotoCalibration,
  type PhotoList,
  PHOTO_LIMIT_PER_SUBJECT,
  type PhotoMediaType,
  PHOTOS_PROBLEM_CODES,
  type Role,
} from '@counterpoise/api';
import type { Clock } from '../clock';
import { HttpProblem } from '../http/problem';
import { EXTENSIONS, processPhoto, sniffPhotoType } from './photo-image';
import type { PhotoStore } from './photo-store';
import type { PhotoRow, PhotoSubject, PhotosRepo } from './photos.repo';

/** Who calls the photos' service: a signed-in person of an organisation, with their role. */
export interface PhotoActor {
  readonly id: number;
  readonly organisationId: number;
  readonly role: Role;
}

/** The bytes of a stored image or thumbnail, with what the answer says of them. */
export interface PhotoFile {
  readonly bytes: Buffer;
  readonly mediaType: string;
  readonly sha256: string;
}

const THUMBNAIL_EXTENSION = 'webp';

function notFound(subject: PhotoSubject['kind'] | 'photo'): HttpProblem {
  return new HttpProblem(404, 'Not Found', `No ${subject} with this id in your organisation.`);
}

function forbidden(detail: string, code?: string): HttpProblem {
  return new HttpProblem(403, 'Forbidden', detail, undefined, 'about:blank', code);
}

/**
 * The photos of an organisation's machines and jobs. An upload is checked by its content, re-encoded and
 * stored by hash, and only then recorded; the count limit is checked again in the transaction that writes
 * the row, with the files written under one lock, so that parallel uploads never pass the limit and a
 * refused one leaves neither a row nor a file behind.
 */
export class PhotosService {
  /** The tail of the queue of uploads storing their files and rows, one at a time. */
  private storing: Promise<unknown> = Promise.resolve();

  constructor(
    private readonly repo: PhotosRepo,
    private readonly store: PhotoStore,
    private readonly clock: Clock,
  ) {}

  /**
   * Checks that the machine or job is the organisation's and, for a change, that the caller may change it
   * (a job: its technician, or whoever holds `jobs:write-any`); refuses early a subject already full.
   */
  checkSubject(actor: PhotoActor, subject: PhotoSubject, forUpload: boolean): void {
    if (subject.kind === 'machine') {
      if (!this.repo.findMachine(actor.organisationId, subject.id)) throw notFound('machine');
    } else {
      const job = this.repo.findJob(actor.organisationId, subject.id);
      if (!job) throw notFound('job');
      if (forUpload) this.checkJobWriter(actor, job.technicianId);
    }
    if (forUpload) this.checkRoom(actor, subject);
  }

  list(actor: PhotoActor, subject: PhotoSubject): PhotoList {
    this.checkSubject(actor, subject, false);
    return {
      photos: this.repo.list(actor.organisationId, subject).map(toPhoto),
      limit: PHOTO_LIMIT_PER_SUBJECT,
    };
  }

  get(actor: PhotoActor, id: number): Photo {
    return toPhoto(this.find(actor, id));
  }

  /** Checks, re-encodes and stores an upload on a machine or job. */
  async upload(
    actor: PhotoActor,
    subject: PhotoSubject,
    bytes: Buffer,
    caption: string | null,
  ): Promise<Photo> {
    this.checkSubject(actor, subject, true);
    const mediaType: PhotoMediaType = await sniffPhotoType(bytes);
    const processed = await processPhoto(bytes, mediaType);
    const id = await this.inTurn(async () => {
      // Checked again in turn: another upload may have filled the last place while this one was decoded.
      this.checkRoom(actor, subject);
      const written: [string, string][] = [];
      try {
        const extension = EXTENSIONS[processed.image.mediaType];
        if (await this.store.put(processed.image.sha256, extension, processed.image.bytes)) {
          written.push([processed.image.sha256, extension]);
        }
        const thumbnail = processed.thumbnail;
        if (await this.store.put(thumbnail.sha256, THUMBNAIL_EXTENSION, thumbnail.bytes)) {
          written.push([thumbnail.sha256, THUMBNAIL_EXTENSION]);
        }
        return this.repo.transaction(() => {
          this.checkSubject(actor, subject, true);
          return this.repo.insert({
            organisationId: actor.organisationId,
            machineId: subject.kind === 'machine' ? subject.id : null,
            jobId: subject.kind === 'job' ? subject.id : null,
            sha256: processed.image.sha256,
            thumbnailSha256: thumbnail.sha256,
            mediaType: processed.image.mediaType,
            widthPx: processed.image.widthPx,
            heightPx: processed.image.heightPx,
            byteSize: processed.image.bytes.length,
            caption,
            createdById: actor.id,
            createdAt: this.clock.now(),
          });
        });
      } catch (error) {
        for (const [sha256, extension] of written) {
          if (this.repo.referencesTo(sha256) === 0) await this.store.delete(sha256, extension);
        }
        throw error;
      }
    });
    return this.get(actor, id);
  }

  /** The bytes of a photo or of its thumbnail. */
  async file(actor: PhotoActor, id: number, which: 'image' | 'thumbnail'): Promise<PhotoFile> {
    const row = this.find(actor, id);
    const sha256 = which === 'image' ? row.sha256 : row.thumbnailSha256;
    const extension = which === 'image' ? EXTENSIONS[row.mediaType] : THUMBNAIL_EXTENSION;
    const bytes = await this.store.read(sha256, extension);
    if (bytes === undefined) {
      throw new Error(
        `The file of photo ${row.id} (${sha256}.${extension}) is missing from the uploads folder.`,
      );
    }
    return { bytes, mediaType: which === 'image' ? row.mediaType : 'image/webp', sha256 };
  }

  changeCaption(actor: PhotoActor, id: number, caption: string | null): Photo {
    return this.repo.transaction(() => {
      const row = this.findToChange(actor, id);
      this.repo.setCaption(row.id, caption);
      return this.get(actor, id);
    });
  }

  /** Removes a photo from its machine or job; its row stays, marked removed. */
  remove(actor: PhotoActor, id: number): void {
    this.repo.transaction(() => {
      const row = this.findToChange(actor, id);
      this.repo.remove(row.id, this.clock.now());
    });
  }

  /** Makes a machine's photo its correction overlay's background (the only one), with its calibration. */
  setOverlayBackground(
    actor: PhotoActor,
    machineId: number,
    id: number,
    calibration: PhotoCalibration,
  ): Photo {
    return this.repo.transaction(() => {
      const row = this.machinePhoto(actor, machineId, id);
      this.repo.setOverlayBackground(machineId, row.id, calibration);
      return this.get(actor, id);
    });
  }

  /** The photo stops being the machine's overlay background (its calibration is kept). */
  clearOverlayBackground(actor: PhotoActor, machineId: number, id: number): void {
    this.repo.transaction(() => {
      const row = this.machinePhoto(actor, machineId, id);
      this.repo.clearOverlayBackground(row.id);
    });
  }

  private machinePhoto(actor: PhotoActor, machineId: number, id: number): PhotoRow {
    if (!this.repo.findMachine(actor.organisationId, machineId)) throw notFound('machine');
    const row = this.repo.find(actor.organisationId, id);
    if (!row || row.machineId !== machineId) throw notFound('photo');
    return row;
  }

  private find(actor: PhotoActor, id: number): PhotoRow {
    const row = this.repo.find(actor.organisationId, id);
    if (!row) throw notFound('photo');
    return row;
  }

  /** A photo the caller may change: a machine's with `machines:write`, a job's as the job's writer. */
  private findToChange(actor: PhotoActor, id: number): PhotoRow {
    const row = this.find(actor, id);
    if (row.machineId !== null) {
      if (!can(actor.role, 'machines:write')) throw forbidden('Your role may not change machines’ photos.');
    } else {
      const job = this.repo.findJob(actor.organisationId, row.jobId!);
      if (!job) throw notFound('photo');
      this.checkJobWriter(actor, job.technicianId);
    }
    return row;
  }

  private checkJobWriter(actor: PhotoActor, technicianId: number): void {
    if (!can(actor.role, 'jobs:write')) throw forbidden('Your role may not change jobs’ photos.');
    if (technicianId !== actor.id && !can(actor.role, 'jobs:write-any')) {
      throw forbidden(
        'This job is another technician’s: a manager may add or change its photos.',
        JOBS_PROBLEM_CODES.notYourJob,
      );
    }
  }

  private checkRoom(actor: PhotoActor, subject: PhotoSubject): void {
    if (this.repo.countActive(actor.organisationId, subject) >= PHOTO_LIMIT_PER_SUBJECT) {
      throw new HttpProblem(
        409,
        'Conflict',
        `This ${subject.kind} already holds ${PHOTO_LIMIT_PER_SUBJECT} photos; remove one before adding another.`,
        undefined,
        'about:blank',
        PHOTOS_PROBLEM_CODES.tooMany,
      );
    }
  }

  /** Runs `work` after every earlier upload's storing has ended, so that two never interleave. */
  private inTurn<R>(work: () => Promise<R>): Promise<R> {
    const turn = this.storing.then(work, work);
    this.storing = turn.catch(() => undefined);
    return turn;
  }
}

/** A stored row as the API answers it. */
export function toPhoto(row: PhotoRow): Photo {
  return {
    id: row.id,
    machineId: row.machineId,
    jobId: row.jobId,
    mediaType: row.mediaType,
    widthPx: row.widthPx,
    heightPx: row.heightPx,
    byteSize: row.byteSize,
    caption: row.caption,
    calibration: row.calibration ?? null,
    overlayBackground: row.overlayBackground,
    createdById: row.createdById,
    createdByName: row.createdByName,
    createdAt: row.createdAt.toISOString(),
  };
}
