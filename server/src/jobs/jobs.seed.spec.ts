/*
 * The demo jobs: run through the jobs' service as the demo technician, deterministic from the seed's
 * date, seeded once, and enough completed jobs per family for a refined sensitivity.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { JobSchema, JobsHomeSchema } from '@counterpoise/api';
import { AccountsRepo } from '../accounts/accounts.repo';
import { DEMO_ORGANISATION } from '../auth/accounts.seed';
import { DEMO_SEEDERS } from '../db/demo-seeders';
import { seedDemoData } from '../db/seed';
import { MachineFamiliesRepo } from '../machine-families/machine-families.repo';
import { MachineFamiliesService } from '../machine-families/machine-families.service';
import { ChangeLog } from '../records/change-log';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';
import { DEMO_JOBS } from './jobs.seed';
import { JobsRepo } from './jobs.repo';
import { type JobActor, JobsService } from './jobs.service';

const now = new Date('2026-03-02T08:00:00Z');
let first: TemporaryDatabase;
let second: TemporaryDatabase;
let dataDir: string;

beforeAll(async () => {
  dataDir = mkdtempSync(join(tmpdir(), 'counterpoise-demo-jobs-'));
  first = openTemporaryDatabase();
  second = openTemporaryDatabase();
  await seedDemoData(first.database, now, DEMO_SEEDERS, { dataDir });
  await seedDemoData(second.database, now, DEMO_SEEDERS, { dataDir });
});
afterAll(() => {
  first.dispose();
  second.dispose();
  rmSync(dataDir, { recursive: true, force: true });
});

function service(temporary: TemporaryDatabase) {
  const clock = { now: () => now };
  const accounts = new AccountsRepo(temporary.database.orm);
  const organisation = accounts.findOrganisationByName(DEMO_ORGANISATION)!;
  const people = accounts.listUsers(organisation.id);
  const role = (name: string): JobActor => people.find((person) => person.role === name)!;
  return {
    technician: role('technician'),
    manager: role('manager'),
    jobs: new JobsService(
      new JobsRepo(temporary.database.orm),
      new MachineFamiliesService(
        new MachineFamiliesRepo(temporary.database.orm),
        new ChangeLog(temporary.database.orm),
        clock,
      ),
      clock,
    ),
    families: new MachineFamiliesService(
      new MachineFamiliesRepo(temporary.database.orm),
      new ChangeLog(temporary.database.orm),
      clock,
    ),
  };
}

const everything = { page: 1, pageSize: 100 };

describe('the demo jobs', () => {
  it('are completed on the demo machines, accepted, with one job left half-way', () => {
    const { technician, jobs } = service(first);
    const page = jobs.list(technician, everything);
    expect(page.total).toBe(DEMO_JOBS.length);
    const full = page.items.map((item) => jobs.get(technician, item.id));
    for (const job of full) expect(JobSchema.safeParse(job).error).toBeUndefined();
    const completed = full.filter((job) => job.status === 'completed');
    expect(completed).toHaveLength(DEMO_JOBS.length - 1);
    for (const job of completed) {
      expect(job.completion?.accepted, `job ${job.id}`).toBe(true);
      expect(job.corrections[0]?.method).toBe('multi-plane');
      for (const side of job.completion!.beforeAfter)
        expect(side.after.amplitude).toBeLessThan(side.before.amplitude);
    }
    const open = full.filter((job) => job.status === 'open');
    expect(open).toHaveLength(1);
    expect(open[0]!.runs.map((run) => run.kind)).toEqual(['initial', 'trial']);
    expect(open[0]!.nextStep).toBe('correction');
  });

  it('refine each family’s sensitivity from several jobs', () => {
    const { technician, families } = service(first);
    const page = families.list(technician, { archived: 'all', sort: 'name', order: 'asc', ...everything });
    const mulcher = page.items.find((family) => family.rotorType === 'fixed-tooth-drum')!;
    const flail = page.items.find((family) => family.rotorType === 'flail')!;
    expect(mulcher.sensitivities.map((figure) => figure.jobCount)).toEqual([4, 4, 4, 4]);
    expect(flail.sensitivities.map((figure) => figure.jobCount)).toEqual([3, 3, 3, 3]);
    const own = mulcher.sensitivities.find(
      (figure) => figure.sensorSide === 'left' && figure.planeIndex === 0,
    )!;
    // The demo mulchers answer about 0.0016 in/s per gram: about 625 g per in/s.
    expect(own.gramsPerUnit).toBeGreaterThan(560);
    expect(own.gramsPerUnit).toBeLessThan(700);
    expect(own.spread?.massPercent).toBeGreaterThan(0);
  });

  it('give the technician’s day: the open job, and the machine whose last job is old', () => {
    const { technician, manager, jobs } = service(first);
    const home = JobsHomeSchema.parse(jobs.home(technician));
    expect(home.myOpenJobs.map((job) => job.machine.serialNumber)).toEqual(['BF250-00921']);
    expect(home.machinesDue.map((due) => due.machine.serialNumber)).toEqual(['QS180-0612']);
    expect(jobs.home(manager).myOpenJobs).toEqual([]);
  });

  it('are the same on every fresh database, and seeded once', async () => {
    const a = service(first);
    const b = service(second);
    const all = (s: ReturnType<typeof service>) =>
      s.jobs.list(s.technician, everything).items.map((item) => s.jobs.get(s.technician, item.id));
    expect(all(b)).toEqual(all(a));
    expect(await seedDemoData(first.database, new Date(), DEMO_SEEDERS, { dataDir })).toEqual({
      seeded: false,
    });
    expect(a.jobs.list(a.technician, everything).total).toBe(DEMO_JOBS.length);
  });
});
