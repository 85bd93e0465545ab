import { and, asc, count, eq, getTableColumns, isNull, or } from 'drizzle-orm';
import type { Orm } from '../db/database';
import { jobs, machines, photos, users } from '../db/schema';

/** A photo as stored, with the name of who took it. */
export type PhotoRow = typeof photos.$inferSelect & { readonly createdByName: string };

/** What a photo hangs on: a machine or a job. */
export type PhotoSubject =
  { readonly kind: 'machine'; readonly id: number } | { readonly kind: 'job'; readonly id: number };

/** The columns a new photo is written with. */
export type NewPhoto = Omit<
  typeof photos.$inferInsert,
  'id' | 'removedAt' | 'overlayBackground' | 'calibration'
>;

/** The photos table, always read and written within one organisation. */
export class PhotosRepo {
  constructor(private readonly orm: Orm) {}

  /** Runs `work` in one write transaction, taken at its start so that no other writer slips between. */
  transaction<R>(work: () => R): R {
    return this.orm.transaction(() => work(), { behavior: 'immediate' });
  }

  /** The machine of that id in the organisation, if any. */
  findMachine(organisationId: number, id: number): { id: number } | undefined {
    return this.orm
      .select({ id: machines.id })
      .from(machines)
      .where(and(eq(machines.id, id), eq(machines.organisationId, organisationId)))
      .get();
  }

  /** The job of that id in the organisation, with its technician, if any. */
  findJob(organisationId: number, id: number): { id: number; technicianId: number } | undefined {
    return this.orm
      .select({ id: jobs.id, technicianId: jobs.technicianId })
      .from(jobs)
      .where(and(eq(jobs.id, id), eq(jobs.organisationId, organisationId)))
      .get();
  }

  /** How many photos the subject holds, removed ones left out. */
  countActive(organisationId: number, subject: PhotoSubject): number {
    return (
      this.orm
        .select({ n: count() })
        .from(photos)
        .where(
          and(eq(photos.organisationId, organisationId), this.subjectIs(subject), isNull(photos.removedAt)),
        )
        .get()?.n ?? 0
    );
  }

  insert(values: NewPhoto): number {
    return this.orm.insert(photos).values(values).returning({ id: photos.id }).get().id;
  }

  /** A photo of the organisation that is not removed. */
  find(organisationId: number, id: number): PhotoRow | undefined {
    return this.select()
      .where(and(eq(photos.id, id), eq(photos.organisationId, organisationId), isNull(photos.removedAt)))
      .get();
  }

  /** The subject's photos that are not removed, oldest first. */
  list(organisationId: number, subject: PhotoSubject): PhotoRow[] {
    return this.select()
      .where(
        and(eq(photos.organisationId, organisationId), this.subjectIs(subject), isNull(photos.removedAt)),
      )
      .orderBy(asc(photos.createdAt), asc(photos.id))
      .all();
  }

  /** How many rows (removed ones too) name a file of that hash, as image or thumbnail. */
  referencesTo(sha256: string): number {
    return (
      this.orm
        .select({ n: count() })
        .from(photos)
        .where(or(eq(photos.sha256, sha256), eq(photos.thumbnailSha256, sha256)))
        .get()?.n ?? 0
    );
  }

  setCaption(id: number, caption: string | null): void {
    this.orm.update(photos).set({ caption }).where(eq(photos.id, id)).run();
  }

  /** Marks a photo removed; it stops being the overlay's background. */
  remove(id: number, at: Date): void {
    this.orm.update(photos).set({ removedAt: at, overlayBackground: false }).where(eq(photos.id, id)).run();
  }

  /** Makes a machine's photo its only overlay background, with its calibration (call in a transaction). */
  setOverlayBackground(
    machineId: number,
    id: number,
    calibration: NonNullable<PhotoRow['calibration']>,
  ): void {
    this.orm
      .update(photos)
      .set({ overlayBackground: false })
      .where(and(eq(photos.machineId, machineId), eq(photos.overlayBackground, true)))
      .run();
    this.orm.update(photos).set({ overlayBackground: true, calibration }).where(eq(photos.id, id)).run();
  }

  clearOverlayBackground(id: number): void {
    this.orm.update(photos).set({ overlayBackground: false }).where(eq(photos.id, id)).run();
  }

  private subjectIs(subject: PhotoSubject) {
    return subject.kind === 'machine' ? eq(photos.machineId, subject.id) : eq(photos.jobId, subject.id);
  }

  private select() {
    return this.orm
      .select({ ...getTableColumns(photos), createdByName: users.name })
      .from(photos)
      .innerJoin(users, eq(users.id, photos.createdById));
  }
}
