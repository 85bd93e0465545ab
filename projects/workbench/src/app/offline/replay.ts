import type { Job, JobCorrection } from '@counterpoise/api';
import type { CorrectionAgreement, OfflineJobChange } from './local-rules';
import { etagOfVersion } from '../records/records-api';
import type { OfflineStorage, QueuedChange, QueuedRefusal } from './offline-storage';

/** A job as the server answered it, with its ETag. */
export interface ServerJob {
  readonly record: Job;
  readonly etag: string;
}

/**
 * How a request ended when it did not store the change, as the replay needs to tell them apart: no answer (go
 * offline and try later), the job changed meanwhile (412, with the job as stored), the session ended (401),
 * the server failing (5xx, 429: try later), or a refusal of the change itself (400, 403, 404, 409…).
 */
export type SendFailure =
  | { readonly kind: 'no-answer' }
  | { readonly kind: 'changed-meanwhile'; readonly current: ServerJob }
  | { readonly kind: 'signed-out' }
  | { readonly kind: 'server-failing'; readonly message: string }
  | { readonly kind: 'refused'; readonly refusal: QueuedRefusal };

/** The server as the replay sees it: one change sent on an ETag, or the job read again. */
export interface JobChangeSender {
  /** Sends the change; resolves with the job as stored, or rejects with a `SendFailure`. */
  send(jobId: number, change: OfflineJobChange, etag: string, basis: Job): Promise<ServerJob>;
  /** Reads the job as stored now; rejects with a `SendFailure`. */
  read(jobId: number): Promise<ServerJob>;
}

/** How one job's waiting changes went. */
export type JobReplayOutcome =
  | { readonly kind: 'sent'; readonly job: ServerJob; readonly sent: number }
  | { readonly kind: 'conflict'; readonly job: ServerJob; readonly sent: number }
  | { readonly kind: 'refused'; readonly job: ServerJob | null; readonly sent: number }
  /** No answer, the server failing or the session ended: everything stops and is tried again later. */
  | { readonly kind: 'stopped'; readonly reason: SendFailure['kind']; readonly sent: number };

/** What the replay needs besides the storage and the server. */
export interface ReplayDeps {
  readonly storage: OfflineStorage;
  readonly sender: JobChangeSender;
  /** The job as last read from the server and kept on the device, or null. */
  readonly keptJob: (jobId: number) => Promise<ServerJob | null>;
  /** Keeps the job as the server answered it. */
  readonly keepJob: (job: ServerJob) => Promise<void>;
  /** The rules' comparison of two corrections (`compareCorrections`). */
  readonly compareCorrections: (device: JobCorrection, server: JobCorrection) => CorrectionAgreement;
  readonly now: () => Date;
  /** Told before each change is sent (for "Sending 2…"). */
  readonly onSending?: (change: QueuedChange, left: number) => void;
}

/** Whether a value is a `SendFailure` (as the sender rejects). */
export function isSendFailure(value: unknown): value is SendFailure {
  return (
    typeof value === 'object' &&
    value !== null &&
    'kind' in value &&
    ['no-answer', 'changed-meanwhile', 'signed-out', 'server-failing', 'refused'].includes(
      (value as { kind: string }).kind,
    )
  );
}

/**
 * Whether the job as stored now (`current`, from a 412) already holds the change sent on `basis`: the answer
 * was lost on its way back (a dropped connection, a closed lid) and sending it again would store it twice.
 * It does when the server's version is exactly one on, and the job holds what this change adds (the step's
 * record where there was none or a newer one, one more run of the same kind, one more correction by the same
 * method, the weights of that correction where there were none). Another person making the same kind of
 * change in the same moment would be taken for it: rare, and nothing is lost (the device's copy is the same
 * kind of change).
 */
export function holdsChange(basis: Job, current: Job, change: OfflineJobChange): boolean {
  if (current.version !== basis.version + 1) return false;
  switch (change.kind) {
    case 'acknowledge-safety':
      return basis.safety === null && current.safety !== null;
    case 'record-inspection':
      return (
        current.inspection !== null &&
        current.inspection.measuredAt !== basis.inspection?.measuredAt &&
        current.inspection.bearingEndPlayMm === change.body.bearingEndPlayMm &&
        current.inspection.shaftRunoutMm === change.body.shaftRunoutMm
      );
    case 'record-setup':
      return current.setup !== null && current.setup.recordedAt !== basis.setup?.recordedAt;
    case 'add-run':
      return current.runs.length === basis.runs.length + 1 && current.runs.at(-1)?.kind === change.body.kind;
    case 'compute-correction':
      return (
        current.corrections.length === basis.corrections.length + 1 &&
        current.corrections.at(-1)?.method === change.body.method
      );
    case 'record-installed': {
      const before = basis.corrections.find((c) => c.sequence === change.correctionSequence);
      const after = current.corrections.find((c) => c.sequence === change.correctionSequence);
      return before?.installed === null && (after?.installed ?? null) !== null;
    }
  }
}

/**
 * Sends one job's waiting changes to the server, in the order they were made, each on the ETag of the answer
 * before it (the first on the version it was made on). Each change stored leaves the queue at once, so that a
 * crash after it is never sent twice; a change whose answer was lost is found in the job as stored
 * (`holdsChange`) and leaves the queue too. A 412 for anything else keeps the changes and records a conflict
 * for a person to resolve; a refusal marks the change and stops the job's queue there. After a correction
 * computed on the device is stored, the server's is compared with it, and a disagreement is kept.
 */
export async function replayJob(deps: ReplayDeps, userId: number, jobId: number): Promise<JobReplayOutcome> {
  const waiting = (await deps.storage.changes(userId)).filter((c) => c.jobId === jobId);
  let sent = 0;
  if (waiting.length === 0) return { kind: 'sent', job: (await deps.keptJob(jobId))!, sent };
  if (waiting[0]!.refusal !== null) return { kind: 'refused', job: await deps.keptJob(jobId), sent };

  // The job as stored when the first change was made: the kept copy, or the server's if that moved on.
  let basis = await deps.keptJob(jobId);
  if (basis === null || basis.record.version !== waiting[0]!.baseVersion) {
    try {
      basis = await deps.sender.read(jobId);
      await deps.keepJob(basis);
    } catch (failure) {
      return stopped(failure, sent);
    }
    if (basis.record.version !== waiting[0]!.baseVersion) {
      await deps.storage.putConflict({
        userId,
        jobId,
        current: basis.record,
        etag: basis.etag,
        seenAt: deps.now().toISOString(),
      });
      return { kind: 'conflict', job: basis, sent };
    }
  }
  let etag = basis.etag || etagOfVersion(basis.record.version);

  for (const [index, change] of waiting.entries()) {
    deps.onSending?.(change, waiting.length - index);
    let answer: ServerJob;
    try {
      answer = await deps.sender.send(jobId, change.change, etag, basis.record);
    } catch (failure) {
      if (!isSendFailure(failure)) throw failure;
      if (
        failure.kind === 'changed-meanwhile' &&
        holdsChange(basis.record, failure.current.record, change.change)
      ) {
        answer = failure.current;
      } else if (failure.kind === 'changed-meanwhile') {
        await deps.keepJob(failure.current);
        // Another tab of this device may have sent them meanwhile: no change left, nothing to resolve.
        const left = (await deps.storage.changes(userId)).filter((c) => c.jobId === jobId);
        if (left.length === 0) return { kind: 'sent', job: failure.current, sent };
        await deps.storage.putConflict({
          userId,
          jobId,
          current: failure.current.record,
          etag: failure.current.etag,
          seenAt: deps.now().toISOString(),
        });
        return { kind: 'conflict', job: failure.current, sent };
      } else if (failure.kind === 'refused') {
        await deps.storage.putChange({ ...change, refusal: failure.refusal });
        return { kind: 'refused', job: basis, sent };
      } else {
        return stopped(failure, sent);
      }
    }
    await deps.storage.removeChange(change.key);
    await deps.keepJob(answer);
    sent++;
    if (change.change.kind === 'compute-correction')
      await compareCorrection(deps, userId, change, answer.record);
    basis = answer;
    etag = answer.etag || etagOfVersion(answer.record.version);
  }
  return { kind: 'sent', job: basis, sent };
}

/** Compares the server's stored correction with the one the device computed for the same change. */
async function compareCorrection(
  deps: ReplayDeps,
  userId: number,
  change: QueuedChange,
  server: Job,
): Promise<void> {
  const device = change.after.corrections.at(-1);
  if (!device) return;
  const stored = server.corrections.find((c) => c.sequence === device.sequence) ?? server.corrections.at(-1);
  if (!stored) return;
  const agreement = deps.compareCorrections(device, stored);
  if (agreement.agrees) return;
  await deps.storage.putDisagreement({
    userId,
    jobId: change.jobId,
    correctionSequence: stored.sequence,
    differences: agreement.differences,
    device,
    server: stored,
    foundAt: deps.now().toISOString(),
  });
}

function stopped(failure: unknown, sent: number): JobReplayOutcome {
  if (!isSendFailure(failure)) throw failure;
  return { kind: 'stopped', reason: failure.kind, sent };
}
