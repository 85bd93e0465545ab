import { and, asc, eq, inArray, or, sql } from 'drizzle-orm';
import type { Orm } from '../db/database';
import { jobReports, jobs } from '../db/schema';

/** The latest signed revision of a job's report. */
export interface SignedReport {
  readonly revision: number;
  readonly signedAt: Date;
}

/**
 * What the history and the export read besides the jobs' own service: which jobs to show (always within
 * one organisation) and whether their reports are signed. The jobs themselves are read through
 * `JobsService.get`, so that they look exactly as the job routes show them.
 */
export class MachineHistoryRepo {
  constructor(private readonly orm: Orm) {}

  /** Runs `work` in one read transaction, so that every job it reads is of the same moment. */
  snapshot<R>(work: () => R): R {
    return this.orm.transaction(() => work(), { behavior: 'deferred' });
  }

  /** The ids of a machine's jobs, oldest first (by date, then number). */
  jobIdsOfMachine(organisationId: number, machineId: number): number[] {
    return this.orm
      .select({ id: jobs.id })
      .from(jobs)
      .where(and(eq(jobs.organisationId, organisationId), eq(jobs.machineId, machineId)))
      .orderBy(asc(jobs.scheduledFor), asc(jobs.id))
      .all()
      .map((row) => row.id);
  }

  /**
   * The ids of the organisation's jobs scheduled, or completed (the UTC day of `completedAt`), from `from`
   * to `to` (both `YYYY-MM-DD`, included), by date, then number.
   */
  jobIdsInRange(organisationId: number, from: string, to: string): number[] {
    const completedOn = sql`substr(json_extract(${jobs.completion}, '$.completedAt'), 1, 10)`;
    return this.orm
      .select({ id: jobs.id })
      .from(jobs)
      .where(
        and(
          eq(jobs.organisationId, organisationId),
          or(
            sql`${jobs.scheduledFor} BETWEEN ${from} AND ${to}`,
            sql`${completedOn} BETWEEN ${from} AND ${to}`,
          ),
        ),
      )
      .orderBy(asc(jobs.scheduledFor), asc(jobs.id))
      .all()
      .map((row) => row.id);
  }

  /** The latest signed revision of each job's report, for the jobs that have one. */
  signedReports(organisationId: number, jobIds: readonly number[]): Map<number, SignedReport> {
    const found = new Map<number, SignedReport>();
    // SQLite takes a bounded number of parameters: ask in slices.
    for (let start = 0; start < jobIds.length; start += 500) {
      const rows = this.orm
        .select({ jobId: jobReports.jobId, revision: jobReports.revision, signedAt: jobReports.signedAt })
        .from(jobReports)
        .where(
          and(
            eq(jobReports.organisationId, organisationId),
            inArray(jobReports.jobId, jobIds.slice(start, start + 500)),
          ),
        )
        .all();
      for (const row of rows) {
        const known = found.get(row.jobId);
        if (known === undefined || row.revision > known.revision) {
          found.set(row.jobId, { revision: row.revision, signedAt: row.signedAt });
        }
      }
    }
    return found;
  }
}
