import { HttpClient, type HttpResponse } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type {
  AddRun,
  CorrectionMethod,
  CorrectRunReadings,
  CreateJob,
  Job,
  JobListQuery,
  JobPage,
  JobsHome,
  JobSafetyTopic,
  RecordInspection,
  RecordInstalled,
  ReadingsImportPreview,
  RecordSetup,
} from '@counterpoise/api';
import { map, type Observable } from 'rxjs';
import {
  type ChangedMeanwhile,
  changedMeanwhileOf,
  etagOfVersion,
  queryParams,
  type Versioned,
} from '../records/records-api';

/*
 * The shapes of the jobs routes come from the shared schemas by type alone, so that the job pages never load
 * zod. docs/jobs.md describes the routes, the states and the steps.
 */
export type {
  AddRun,
  CorrectionMethod,
  CorrectRunReadings,
  CreateJob,
  Job,
  JobCorrection,
  JobPage,
  JobRun,
  JobsHome,
  JobSafetyTopic,
  JobStatus,
  JobStep,
  JobSummary,
  InstalledWeight,
  RecordInspection,
  RecordInstalled,
  ImportedRun,
  ReadingsImportError,
  ReadingsImportPreview,
  RecordSetup,
  RunKind,
  RunRetype,
} from '@counterpoise/api';

/** The list's filters and page; what is left out takes the server's default. */
export type JobListFilters = Partial<JobListQuery>;

/** A job as read or written, with the ETag its next change sends back. */
export type VersionedJob = Versioned<Job>;

/**
 * The balancing jobs on the server: the list and the technician's day, one job, and each step of it. Every
 * step answers the whole job as stored (with its new ETag), so the screen shows what the server keeps and
 * nothing else; every change sends the ETag it was made on in `If-Match`.
 */
@Injectable({ providedIn: 'root' })
export class JobsApi {
  private readonly http = inject(HttpClient);
  private readonly url = '/api/v1/jobs';

  /** One page of the shop's jobs, newest date first, filtered by the server. */
  list(filters: JobListFilters): Observable<JobPage> {
    return this.http.get<JobPage>(this.url, { params: queryParams(filters) });
  }

  /** The caller's day: their open jobs, jobs waiting for a manager, machines due. */
  home(): Observable<JobsHome> {
    return this.http.get<JobsHome>(`${this.url}/home`);
  }

  /** One job and its ETag. */
  get(id: number): Observable<VersionedJob> {
    return this.http
      .get<Job>(this.jobUrl(id), { observe: 'response' })
      .pipe(map((response) => versioned(response)));
  }

  /** Starts a job on a machine for a date (a manager names the technician; anyone else does their own). */
  create(job: CreateJob): Observable<VersionedJob> {
    return this.http
      .post<Job>(this.url, job, { observe: 'response' })
      .pipe(map((response) => versioned(response)));
  }

  /** Gives the job to another technician (managers). */
  assign(id: number, technicianId: number, etag: string): Observable<VersionedJob> {
    return this.change('POST', id, 'assign', { technicianId }, etag);
  }

  /** Stops the job, keeping the reason; a manager can reopen it. */
  abandon(id: number, reason: string, etag: string): Observable<VersionedJob> {
    return this.change('POST', id, 'abandon', { reason }, etag);
  }

  /** Opens an abandoned job again (managers). */
  reopen(id: number, etag: string): Observable<VersionedJob> {
    return this.change('POST', id, 'reopen', null, etag);
  }

  /** Step 1: the technician has read every safety topic. */
  acknowledgeSafety(id: number, topicIds: readonly JobSafetyTopic[], etag: string): Observable<VersionedJob> {
    return this.change('PUT', id, 'safety', { topicIds }, etag);
  }

  /** Step 2: the inspection as measured; the server judges it and may put the job on hold. */
  recordInspection(id: number, inspection: RecordInspection, etag: string): Observable<VersionedJob> {
    return this.change('PUT', id, 'inspection', inspection, etag);
  }

  /** Lets a job on hold go on, with the reason kept for the report (managers). */
  overrideInspection(id: number, reason: string, etag: string): Observable<VersionedJob> {
    return this.change('POST', id, 'inspection/override', { reason }, etag);
  }

  /** Step 3: the instrument and where it sits. */
  recordSetup(id: number, setup: RecordSetup, etag: string): Observable<VersionedJob> {
    return this.change('PUT', id, 'setup', setup, etag);
  }

  /** Step 4: one run's readings; the server averages the repeats and checks them. */
  addRun(id: number, run: AddRun, etag: string): Observable<VersionedJob> {
    return this.change('POST', id, 'runs', run, etag);
  }

  /**
   * Step 4: the latest run's readings typed again when they were mistyped (and a trial run's trial weight,
   * if given); the server averages and checks them again and keeps what was typed before in the run's
   * `retyped`. A run a later run or a correction rests on is refused (409 `RUN_IN_USE`): take a new run.
   */
  correctRunReadings(
    id: number,
    runId: number,
    body: CorrectRunReadings,
    etag: string,
  ): Observable<VersionedJob> {
    return this.change('PUT', id, `runs/${encodeURIComponent(runId)}/readings`, body, etag);
  }

  /**
   * Step 4: what a readings file (docs/readings-csv.md) would add to the job as it stands, and every bad row;
   * the server saves nothing. The file goes as it is, for the server to read.
   */
  previewReadingsImport(id: number, file: Blob): Observable<ReadingsImportPreview> {
    return this.http.post<ReadingsImportPreview>(`${this.jobUrl(id)}/runs/import/preview`, file, {
      headers: { 'Content-Type': 'text/csv' },
    });
  }

  /**
   * Step 4: every run of a readings file added in one go, on the version its preview was made on (`etag`):
   * all or none (a 400 naming each bad row), and a 412 when the job changed since the preview.
   */
  importReadings(id: number, file: Blob, etag: string): Observable<VersionedJob> {
    return this.http
      .post<Job>(`${this.jobUrl(id)}/runs/import`, file, {
        observe: 'response',
        headers: { 'Content-Type': 'text/csv', 'If-Match': etag },
      })
      .pipe(map((response) => versioned(response)));
  }

  /** Step 5: a correction by the method chosen, computed by the server from the stored runs. */
  computeCorrection(id: number, method: CorrectionMethod, etag: string): Observable<VersionedJob> {
    return this.change('POST', id, 'corrections', { method }, etag);
  }

  /** Step 5: the weights really fitted for a correction; the server predicts their reading. */
  recordInstalled(
    id: number,
    correctionId: number,
    installed: RecordInstalled,
    etag: string,
  ): Observable<VersionedJob> {
    return this.change(
      'PUT',
      id,
      `corrections/${encodeURIComponent(correctionId)}/installed`,
      installed,
      etag,
    );
  }

  /** Step 7: closes the job with its before and after, and refines the family's sensitivity. */
  complete(id: number, etag: string): Observable<VersionedJob> {
    return this.change('POST', id, 'complete', null, etag);
  }

  /** The job as stored now when a change was refused because it changed meanwhile (412); null otherwise. */
  changedMeanwhile(error: unknown): ChangedMeanwhile<Job> | null {
    return changedMeanwhileOf<Job>(error);
  }

  private change(
    method: 'POST' | 'PUT',
    id: number,
    path: string,
    body: unknown,
    etag: string,
  ): Observable<VersionedJob> {
    return this.http
      .request<Job>(method, `${this.jobUrl(id)}/${path}`, {
        body,
        observe: 'response',
        headers: { 'If-Match': etag },
      })
      .pipe(map((response) => versioned(response)));
  }

  private jobUrl(id: number): string {
    return `${this.url}/${encodeURIComponent(id)}`;
  }
}

function versioned(response: HttpResponse<Job>): VersionedJob {
  const job = response.body as Job;
  return { record: job, etag: response.headers.get('ETag') ?? etagOfVersion(job.version) };
}
