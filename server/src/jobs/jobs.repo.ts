import { and, asc, desc, eq, gte, inArray, lte, sql } from 'drizzle-orm';
import type { JobListQuery, JobStatus } from '@counterpoise/api';
import type { Orm } from '../db/database';
import { customers, jobCorrections, jobRuns, jobs, machineFamilies, machines, users } from '../db/schema';
import { countAll } from '../records/list-query';

/** A job as stored, with what it shows of its machine, customer and family. */
export type JobRow = typeof jobs.$inferSelect & {
  readonly serialNumber: string | null;
  readonly make: string | null;
  readonly model: string | null;
  readonly customerId: number;
  readonly customerName: string;
  readonly familyId: number | null;
  readonly familyName: string | null;
};
export type RunRow = typeof jobRuns.$inferSelect;
export type CorrectionRow = typeof jobCorrections.$inferSelect;
export type MachineRow = typeof machines.$inferSelect;
export type FamilyRow = typeof machineFamilies.$inferSelect;

/** The columns of a job a step writes. */
export type JobChange = Partial<
  Pick<
    typeof jobs.$inferInsert,
    'technicianId' | 'status' | 'safety' | 'inspection' | 'setup' | 'completion' | 'abandonment'
  >
>;

/**
 * The jobs, their runs and corrections, always read and written within one organisation. Machines,
 * families, customers and people are read here to show a job and check what it names.
 */
export class JobsRepo {
  constructor(readonly orm: Orm) {}

  /** Runs `work` in one write transaction, taken at its start so that no other writer slips between. */
  transaction<R>(work: () => R): R {
    return this.orm.transaction(() => work(), { behavior: 'immediate' });
  }

  private selectJobs() {
    return this.orm
      .select({
        ...jobColumns,
        serialNumber: machines.serialNumber,
        make: machines.make,
        model: machines.model,
        customerId: machines.customerId,
        customerName: customers.name,
        familyId: machines.familyId,
        familyName: machineFamilies.name,
      })
      .from(jobs)
      .innerJoin(machines, eq(machines.id, jobs.machineId))
      .innerJoin(customers, eq(customers.id, machines.customerId))
      .leftJoin(machineFamilies, eq(machineFamilies.id, machines.familyId));
  }

  find(organisationId: number, id: number): JobRow | undefined {
    return this.selectJobs()
      .where(and(eq(jobs.id, id), eq(jobs.organisationId, organisationId)))
      .get();
  }

  runsOf(organisationId: number, jobId: number): RunRow[] {
    return this.orm
      .select()
      .from(jobRuns)
      .where(and(eq(jobRuns.jobId, jobId), eq(jobRuns.organisationId, organisationId)))
      .orderBy(asc(jobRuns.sequence))
      .all();
  }

  correctionsOf(organisationId: number, jobId: number): CorrectionRow[] {
    return this.orm
      .select()
      .from(jobCorrections)
      .where(and(eq(jobCorrections.jobId, jobId), eq(jobCorrections.organisationId, organisationId)))
      .orderBy(asc(jobCorrections.sequence))
      .all();
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

  /** The organisation's person of this id, with role and status. */
  findPerson(organisationId: number, id: number) {
    return this.orm
      .select({ id: users.id, name: users.name, role: users.role, status: users.status })
      .from(users)
      .where(and(eq(users.id, id), eq(users.organisationId, organisationId)))
      .get();
  }

  findMachine(organisationId: number, id: number): MachineRow | undefined {
    return this.orm
      .select()
      .from(machines)
      .where(and(eq(machines.id, id), eq(machines.organisationId, organisationId)))
      .get();
  }

  findFamily(organisationId: number, id: number): FamilyRow | undefined {
    return this.orm
      .select()
      .from(machineFamilies)
      .where(and(eq(machineFamilies.id, id), eq(machineFamilies.organisationId, organisationId)))
      .get();
  }

  insertJob(
    organisationId: number,
    values: { machineId: number; technicianId: number; scheduledFor: string; createdById: number },
    at: Date,
  ): number {
    return this.orm
      .insert(jobs)
      .values({ ...values, organisationId, status: 'open', version: 1, createdAt: at, updatedAt: at })
      .returning({ id: jobs.id })
      .get().id;
  }

  /**
   * Writes `change` and the next version, only where the stored version is still `version`: the check
   * and the write are one statement, so of two writes on one version exactly one lands.
   */
  writeAtVersion(organisationId: number, id: number, version: number, change: JobChange, at: Date): boolean {
    return (
      this.orm
        .update(jobs)
        .set({ ...change, updatedAt: at, version: sql`${jobs.version} + 1` })
        .where(and(eq(jobs.id, id), eq(jobs.organisationId, organisationId), eq(jobs.version, version)))
        .run().changes === 1
    );
  }

  insertRun(values: Omit<typeof jobRuns.$inferInsert, 'id'>): number {
    return this.orm.insert(jobRuns).values(values).returning({ id: jobRuns.id }).get().id;
  }

  /** Replaces a run's readings, warnings and trial weight, with the retypings that keep what was before. */
  retypeRun(
    organisationId: number,
    id: number,
    values: Pick<typeof jobRuns.$inferInsert, 'readings' | 'warnings' | 'trialWeight' | 'retyped'>,
  ): void {
    this.orm
      .update(jobRuns)
      .set(values)
      .where(and(eq(jobRuns.id, id), eq(jobRuns.organisationId, organisationId)))
      .run();
  }

  insertCorrection(values: Omit<typeof jobCorrections.$inferInsert, 'id'>): number {
    return this.orm.insert(jobCorrections).values(values).returning({ id: jobCorrections.id }).get().id;
  }

  setInstalled(
    organisationId: number,
    id: number,
    values: Pick<typeof jobCorrections.$inferInsert, 'installed' | 'predicted' | 'installedAt'>,
  ): void {
    this.orm
      .update(jobCorrections)
      .set(values)
      .where(and(eq(jobCorrections.id, id), eq(jobCorrections.organisationId, organisationId)))
      .run();
  }

  /** One page of the organisation's jobs that match the filters, newest date first, and the total. */
  list(
    organisationId: number,
    query: Required<Pick<JobListQuery, 'page' | 'pageSize'>> & Omit<JobListQuery, 'page' | 'pageSize'>,
  ): { rows: JobRow[]; total: number } {
    const where = and(
      eq(jobs.organisationId, organisationId),
      query.status === undefined ? undefined : eq(jobs.status, query.status),
      query.technicianId === undefined ? undefined : eq(jobs.technicianId, Number(query.technicianId)),
      query.machineId === undefined ? undefined : eq(jobs.machineId, Number(query.machineId)),
      query.customerId === undefined ? undefined : eq(machines.customerId, Number(query.customerId)),
      query.from === undefined ? undefined : gte(jobs.scheduledFor, query.from),
      query.to === undefined ? undefined : lte(jobs.scheduledFor, query.to),
    );
    const pageSize = Number(query.pageSize);
    const rows = this.selectJobs()
      .where(where)
      .orderBy(desc(jobs.scheduledFor), desc(jobs.id))
      .limit(pageSize)
      .offset((Number(query.page) - 1) * pageSize)
      .all();
    const total =
      this.orm
        .select({ total: countAll })
        .from(jobs)
        .innerJoin(machines, eq(machines.id, jobs.machineId))
        .where(where)
        .get()?.total ?? 0;
    return { rows, total };
  }

  /** The organisation's jobs in the given states, optionally of one technician, by date. */
  withStatus(organisationId: number, statuses: readonly JobStatus[], technicianId?: number): JobRow[] {
    return this.selectJobs()
      .where(
        and(
          eq(jobs.organisationId, organisationId),
          inArray(jobs.status, [...statuses]),
          technicianId === undefined ? undefined : eq(jobs.technicianId, technicianId),
        ),
      )
      .orderBy(asc(jobs.scheduledFor), asc(jobs.id))
      .all();
  }

  /** The last job (by date, then id) of each of the organisation's machines in use that had one. */
  lastJobPerMachine(organisationId: number): JobRow[] {
    const latest = this.orm
      .select({ id: sql<number>`max(${jobs.id})`.as('id') })
      .from(jobs)
      .innerJoin(machines, eq(machines.id, jobs.machineId))
      .where(
        and(
          eq(jobs.organisationId, organisationId),
          sql`${machines.archivedAt} IS NULL`,
          sql`${jobs.scheduledFor} = (SELECT max(j2.scheduled_for) FROM jobs j2 WHERE j2.machine_id = ${jobs.machineId})`,
        ),
      )
      .groupBy(jobs.machineId)
      .all()
      .map((row) => row.id);
    if (latest.length === 0) return [];
    return this.selectJobs()
      .where(and(eq(jobs.organisationId, organisationId), inArray(jobs.id, latest)))
      .orderBy(asc(jobs.scheduledFor), asc(jobs.id))
      .all();
  }

  /** The completed jobs of a machine, or of every machine of a family, oldest first. */
  completedJobs(organisationId: number, of: { machineId: number } | { familyId: number }): JobRow[] {
    return this.selectJobs()
      .where(
        and(
          eq(jobs.organisationId, organisationId),
          eq(jobs.status, 'completed'),
          'machineId' in of ? eq(jobs.machineId, of.machineId) : eq(machines.familyId, of.familyId),
        ),
      )
      .orderBy(asc(jobs.scheduledFor), asc(jobs.id))
      .all();
  }
}

const jobColumns = {
  id: jobs.id,
  organisationId: jobs.organisationId,
  machineId: jobs.machineId,
  technicianId: jobs.technicianId,
  scheduledFor: jobs.scheduledFor,
  status: jobs.status,
  safety: jobs.safety,
  inspection: jobs.inspection,
  setup: jobs.setup,
  completion: jobs.completion,
  abandonment: jobs.abandonment,
  version: jobs.version,
  createdById: jobs.createdById,
  createdAt: jobs.createdAt,
  updatedAt: jobs.updatedAt,
};
