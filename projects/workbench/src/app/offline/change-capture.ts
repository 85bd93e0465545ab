import type { Job } from '@counterpoise/api';
import type { OfflineJobChange } from './local-rules';
import { NEVER } from 'rxjs';
import type { JobsApi } from '../jobs/jobs.api';

/** A change of a job as the steps write it: a call of `JobsApi` on the job's id and ETag. */
export type JobChangeCall = (api: JobsApi, id: number, etag: string) => unknown;

/**
 * The change a step's call makes, as the device can queue it, or null when the call is one that needs the
 * server (completing, abandoning, importing a file, assigning…). The call is made on a stand-in of `JobsApi`
 * that sends nothing and notes which step method it was and with what; `record-installed` names the
 * correction by its sequence in `job` (a correction computed on this device has no id of the server's yet).
 */
export function captureChange(call: JobChangeCall, job: Job): OfflineJobChange | null {
  let captured: OfflineJobChange | null = null;
  const note = (change: OfflineJobChange | null) => {
    captured = change;
    return NEVER;
  };
  const recorder: Partial<JobsApi> = {
    acknowledgeSafety: (_id, topicIds) =>
      note({ kind: 'acknowledge-safety', body: { topicIds: [...topicIds] } }),
    recordInspection: (_id, body) => note({ kind: 'record-inspection', body }),
    recordSetup: (_id, body) => note({ kind: 'record-setup', body }),
    addRun: (_id, body) => note({ kind: 'add-run', body }),
    computeCorrection: (_id, method) => note({ kind: 'compute-correction', body: { method } }),
    recordInstalled: (_id, correctionId, body) => {
      const correction = job.corrections.find((c) => c.id === correctionId);
      return note(
        correction ? { kind: 'record-installed', correctionSequence: correction.sequence, body } : null,
      );
    },
  };
  // Every other method of JobsApi is missing from the stand-in: calling it throws, and the change needs the
  // server.
  try {
    call(recorder as JobsApi, job.id, '');
  } catch {
    return null;
  }
  return captured;
}
