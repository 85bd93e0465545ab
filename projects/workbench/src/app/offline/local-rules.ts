// The job's rules as the device applies them, from the shared rules (@counterpoise/api). Until engineer C's
// job-local.ts lands, the contract's shapes are declared here and applying a change refuses.
import type {
  AddRun,
  CorrectionMethod,
  Job,
  JobCorrection,
  Machine,
  MachineFamily,
  RecordInspection,
  RecordInstalled,
  RecordSetup,
  JobSafetyTopic,
} from '@counterpoise/api';
import { JobChangeRefusal } from '@counterpoise/api';

export { JobChangeRefusal };

export interface LocalJobContext {
  readonly machine: Machine;
  readonly family: MachineFamily | null;
}

export type OfflineJobChange =
  | { readonly kind: 'acknowledge-safety'; readonly body: { readonly topicIds: readonly JobSafetyTopic[] } }
  | { readonly kind: 'record-inspection'; readonly body: RecordInspection }
  | { readonly kind: 'record-setup'; readonly body: RecordSetup }
  | { readonly kind: 'add-run'; readonly body: AddRun }
  | { readonly kind: 'compute-correction'; readonly body: { readonly method: CorrectionMethod } }
  | {
      readonly kind: 'record-installed';
      readonly correctionSequence: number;
      readonly body: RecordInstalled;
    };

export interface CorrectionAgreement {
  readonly agrees: boolean;
  readonly differences: readonly string[];
}

export function applyJobChange(
  _job: Job,
  _change: OfflineJobChange,
  _context: LocalJobContext,
  _by: { actor: { id: number; name: string }; at: Date },
): Job {
  throw new JobChangeRefusal(503, 'Not on this device yet', 'This change cannot be made on this device yet.');
}

export function compareCorrections(_device: JobCorrection, _server: JobCorrection): CorrectionAgreement {
  return { agrees: true, differences: [] };
}
