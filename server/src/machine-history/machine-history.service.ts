import type { JobsExportQuery, MachineHistory } from '@counterpoise/api';
import type { JobActor, JobsService } from '../jobs/jobs.service';
import type { MachineFamiliesService } from '../machine-families/machine-families.service';
import type { MachinesService } from '../machines/machines.service';
import { historyJobOf } from './history-figures';
import { jobsCsv } from './jobs-csv';
import type { MachineHistoryRepo } from './machine-history.repo';

/**
 * A machine's history and the export of the shop's jobs. Both read the jobs through the jobs' own service
 * (`JobsService.get`, the shape the job routes answer), the machine and its family through theirs, within
 * the caller's organisation (another organisation's machine is 404), in one read transaction.
 */
export class MachineHistoryService {
  constructor(
    private readonly repo: MachineHistoryRepo,
    private readonly jobs: JobsService,
    private readonly machines: MachinesService,
    private readonly families: MachineFamiliesService,
  ) {}

  /** Every job on the machine, the weights on its rotor now, and its family's stored sensitivity. */
  history(actor: JobActor, machineId: number): MachineHistory {
    return this.repo.snapshot(() => {
      const machine = this.machines.get(actor, machineId);
      const jobs = this.repo
        .jobIdsOfMachine(actor.organisationId, machine.id)
        .map((id) => this.jobs.get(actor, id));
      // The figures are compared in the unit of the latest job read: the shop's present practice.
      const unit = jobs.findLast((job) => job.setup !== null)?.setup?.amplitudeUnit ?? null;
      // The weights on the rotor are the latest completed job's list, as completing a job reads it.
      const latestCompleted = jobs.findLast((job) => job.completion !== null);
      const dayOf = new Map(jobs.map((job) => [job.id, job.scheduledFor]));
      const family = machine.familyId === null ? null : this.families.get(actor, machine.familyId);
      return {
        machine,
        unit,
        jobs: jobs.map((job) => historyJobOf(job, unit)),
        weightsOnRotor:
          latestCompleted?.completion == null
            ? null
            : {
                jobId: latestCompleted.id,
                completedAt: latestCompleted.completion.completedAt,
                weights: latestCompleted.completion.weightsOnRotor.map((weight) => ({
                  ...weight,
                  fittedOn: dayOf.get(weight.jobId) ?? null,
                })),
              },
        family:
          family === null ? null : { id: family.id, name: family.name, sensitivities: family.sensitivities },
      };
    });
  }

  /** The organisation's jobs scheduled or completed in the range, as the CSV file's text. */
  exportJobs(actor: JobActor, range: JobsExportQuery): string {
    return this.repo.snapshot(() => {
      const ids = this.repo.jobIdsInRange(actor.organisationId, range.from, range.to);
      const jobs = ids.map((id) => {
        const job = this.jobs.get(actor, id);
        return { job, figures: historyJobOf(job, job.setup?.amplitudeUnit ?? null) };
      });
      return jobsCsv(jobs, this.repo.signedReports(actor.organisationId, ids));
    });
  }

  /** The file name of an export: the shop's jobs and the range. */
  static exportFileName(range: JobsExportQuery): string {
    return `counterpoise-jobs-${range.from}-to-${range.to}.csv`;
  }
}
