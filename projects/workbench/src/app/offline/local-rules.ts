// The job's rules as the device applies them: the same functions the server decides with (shared/api's
// job-local.ts). Imported through this file only, and lazily (see offline-jobs.ts), so that the engine stays
// out of the first load.
export {
  applyJobChange,
  compareCorrections,
  type CorrectionAgreement,
  JobChangeRefusal,
  type LocalJobContext,
  type OfflineJobChange,
} from '@counterpoise/api';
