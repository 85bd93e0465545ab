import { and, desc, eq, sql } from 'drizzle-orm';
import type { Orm } from '../db/database';
import { JobsRepo } from '../jobs/jobs.repo';
import {
  customers,
  jobReports,
  jobReportSendings,
  type machineFamilies,
  type machines,
  organisations,
  users,
} from '../db/schema';

export type CustomerRow = typeof customers.$inferSelect;
export type MachineRow = typeof machines.$inferSelect;
export type FamilyRow = typeof machineFamilies.$inferSelect;
export type ReportRow = typeof jobReports.$inferSelect;
/** A signed revision without its bytes. */
export type ReportSummaryRow = Omit<ReportRow, 'pdf' | 'signaturePng'> & { readonly byteSize: number };
export type SendingRow = typeof jobReportSendings.$inferSelect & { readonly revision: number | null };

/** A revision to freeze: everything but its number, which the repo gives. */
export type NewRevision = Omit<typeof jobReports.$inferInsert, 'id' | 'revision'>;

const summaryColumns = {
  id: jobReports.id,
  organisationId: jobReports.organisationId,
  jobId: jobReports.jobId,
  revision: jobReports.revision,
  jobVersion: jobReports.jobVersion,
  sourceSha256: jobReports.sourceSha256,
  signerName: jobReports.signerName,
  pdfSha256: jobReports.pdfSha256,
  signedById: jobReports.signedById,
  signedAt: jobReports.signedAt,
  byteSize: sql<number>`length(${jobReports.pdf})`,
};

/**
 * The reports' queries: the records a report is built from, the signed revisions of a job's report and
 * its sendings, always within one organisation.
 */
export class ReportsRepo {
  private readonly jobs: JobsRepo;

  constructor(private readonly orm: Orm) {
    this.jobs = new JobsRepo(orm);
  }

  organisationName(organisationId: number): string {
    return (
      this.orm
        .select({ name: organisations.name })
        .from(organisations)
        .where(eq(organisations.id, organisationId))
        .get()?.name ?? ''
    );
  }

  findCustomer(organisationId: number, id: number): CustomerRow | undefined {
    return this.orm
      .select()
      .from(customers)
      .where(and(eq(customers.organisationId, organisationId), eq(customers.id, id)))
      .get();
  }

  /** The machine and its family, as the jobs read them. */
  findMachine(organisationId: number, id: number): MachineRow | undefined {
    return this.jobs.findMachine(organisationId, id);
  }

  findFamily(organisationId: number, id: number): FamilyRow | undefined {
    return this.jobs.findFamily(organisationId, id);
  }

  /** The names of the organisation's people, by id. */
  peopleNames(organisationId: number): Map<number, string> {
    const rows = this.orm
      .select({ id: users.id, name: users.name })
      .from(users)
      .where(eq(users.organisationId, organisationId))
      .all();
    return new Map(rows.map((row) => [row.id, row.name]));
  }

  /** The job's signed revisions without their bytes, newest first. */
  revisions(organisationId: number, jobId: number): ReportSummaryRow[] {
    return this.orm
      .select(summaryColumns)
      .from(jobReports)
      .where(and(eq(jobReports.organisationId, organisationId), eq(jobReports.jobId, jobId)))
      .orderBy(desc(jobReports.revision))
      .all();
  }

  /** One revision with its bytes; the latest when `revision` is left out. */
  findRevision(organisationId: number, jobId: number, revision?: number): ReportRow | undefined {
    const where = and(
      eq(jobReports.organisationId, organisationId),
      eq(jobReports.jobId, jobId),
      ...(revision === undefined ? [] : [eq(jobReports.revision, revision)]),
    );
    return this.orm.select().from(jobReports).where(where).orderBy(desc(jobReports.revision)).limit(1).get();
  }

  /** The number the next revision of the job's report gets. */
  nextRevision(organisationId: number, jobId: number): number {
    const row = this.orm
      .select({ latest: sql<number | null>`max(${jobReports.revision})` })
      .from(jobReports)
      .where(and(eq(jobReports.organisationId, organisationId), eq(jobReports.jobId, jobId)))
      .get();
    return (row?.latest ?? 0) + 1;
  }

  /**
   * Freezes a revision under `revision`, in one immediate transaction that checks the number is still the
   * next one; answers false (and writes nothing) when another signing took it meanwhile. The unique index
   * on (job, revision) stands behind the check.
   */
  insertRevision(revision: number, row: NewRevision): boolean {
    return this.orm.transaction(
      (tx) => {
        const latest =
          tx
            .select({ latest: sql<number | null>`max(${jobReports.revision})` })
            .from(jobReports)
            .where(eq(jobReports.jobId, row.jobId))
            .get()?.latest ?? 0;
        if (latest + 1 !== revision) return false;
        tx.insert(jobReports)
          .values({ ...row, revision })
          .run();
        return true;
      },
      { behavior: 'immediate' },
    );
  }

  /** The job's sendings with the revision each sent, newest first. */
  sendings(organisationId: number, jobId: number): SendingRow[] {
    return this.orm
      .select({
        id: jobReportSendings.id,
        organisationId: jobReportSendings.organisationId,
        jobId: jobReportSendings.jobId,
        reportId: jobReportSendings.reportId,
        to: jobReportSendings.to,
        messageId: jobReportSendings.messageId,
        sentById: jobReportSendings.sentById,
        sentAt: jobReportSendings.sentAt,
        revision: jobReports.revision,
      })
      .from(jobReportSendings)
      .leftJoin(jobReports, eq(jobReports.id, jobReportSendings.reportId))
      .where(and(eq(jobReportSendings.organisationId, organisationId), eq(jobReportSendings.jobId, jobId)))
      .orderBy(desc(jobReportSendings.id))
      .all();
  }

  insertSending(row: Omit<typeof jobReportSendings.$inferInsert, 'id'>): number {
    return this.orm.insert(jobReportSendings).values(row).returning({ id: jobReportSendings.id }).get().id;
  }
}
