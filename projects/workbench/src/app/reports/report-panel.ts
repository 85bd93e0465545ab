import { DatePipe, DOCUMENT } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  signal,
  untracked,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { firstValueFrom } from 'rxjs';
import { AuthSession } from '../auth/auth-session';
import { BusyButton } from '../forms/busy-button';
import { ErrorBanner } from '../forms/error-banner';
import type { Job } from '../jobs/jobs.api';
import { httpErrorMessage } from '../shell/server-errors';
import { EmailDialog, type EmailRequest } from './email-dialog';
import { type JobReports, ReportsApi, type ReportSending, saveFile } from './reports.api';
import { type SignatureRequest, SignatureDialog } from './signature-dialog';

/** The job's number as the report writes it, before the server's list has answered. */
function jobNumberOf(id: number): string {
  return `J-${String(id).padStart(6, '0')}`;
}

/**
 * The "Service report" panel of a completed job: where the report stands (signed and current, changed since
 * the signing, or not signed), Download PDF, Customer signs (the signature dialog), E-mail to the customer
 * (the e-mail dialog), every signed revision (superseded ones still downloadable) and every sending.
 */
@Component({
  selector: 'app-report-panel',
  imports: [BusyButton, DatePipe, ErrorBanner, MatButtonModule, MatIconModule],
  templateUrl: './report-panel.html',
  styleUrl: './report-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReportPanel {
  readonly job = input.required<Job>();
  /** The ETag of the job as shown: a signature is given on this version. */
  readonly etag = input<string | null>(null);
  private readonly api = inject(ReportsApi);
  private readonly auth = inject(AuthSession);
  private readonly dialog = inject(MatDialog);
  private readonly document = inject(DOCUMENT);

  protected readonly reports = signal<JobReports | null>(null);
  protected readonly loadError = signal<string | null>(null);
  protected readonly error = signal<string | null>(null);
  protected readonly notice = signal<string | null>(null);
  /** The revision being downloaded (0 for the current report), or null. */
  protected readonly downloading = signal<number | null>(null);

  protected readonly jobNumber = computed(() => this.reports()?.jobNumber ?? jobNumberOf(this.job().id));
  /** Whether the signed-in person may have the customer sign and send the report: the job's technician, a manager. */
  protected readonly editable = computed(() => {
    const me = this.auth.user();
    if (me === null) return false;
    return (
      this.auth.can('jobs:write-any') || (this.auth.can('jobs:write') && this.job().technician.id === me.id)
    );
  });
  protected readonly latest = computed(() => this.reports()?.revisions[0] ?? null);
  protected readonly canSign = computed(
    () => this.editable() && this.etag() !== null && this.job().status === 'completed',
  );
  protected readonly canSend = computed(() => this.editable() && (this.reports()?.signedCurrent ?? false));

  constructor() {
    // The list follows the job shown (its id and version: a change of the job may leave a revision behind).
    const shown = computed(() => `${this.job().id}@${this.job().version}`);
    effect(() => {
      shown();
      untracked(() => void this.load());
    });
  }

  protected async load(id = this.job().id): Promise<void> {
    this.loadError.set(null);
    try {
      this.reports.set(await firstValueFrom(this.api.list(id)));
    } catch (error) {
      this.loadError.set(httpErrorMessage(error));
    }
  }

  protected async download(revision?: number): Promise<void> {
    this.error.set(null);
    this.downloading.set(revision ?? 0);
    try {
      saveFile(this.document, await firstValueFrom(this.api.download(this.job().id, revision)));
    } catch (error) {
      this.error.set(`The report was not downloaded. ${httpErrorMessage(error)}`);
    } finally {
      this.downloading.set(null);
    }
  }

  protected async sign(): Promise<void> {
    const etag = this.etag();
    if (etag === null) return;
    this.notice.set(null);
    const id = this.job().id;
    const data: SignatureRequest = {
      jobNumber: this.jobNumber(),
      sign: (body) => this.api.sign(id, etag, body),
    };
    const ref = this.dialog.open<SignatureDialog, SignatureRequest, JobReports>(SignatureDialog, {
      data,
      width: '720px',
      maxWidth: '96vw',
      autoFocus: 'first-tabbable',
    });
    const signed = await firstValueFrom(ref.afterClosed());
    if (signed === undefined) return;
    this.reports.set(signed);
    const latest = signed.revisions[0];
    if (latest)
      this.notice.set(`Signed by ${latest.signerName}: revision ${latest.revision} is kept as signed.`);
  }

  protected async email(): Promise<void> {
    const reports = this.reports();
    const latest = this.latest();
    if (reports === null || latest === null) return;
    this.notice.set(null);
    const id = this.job().id;
    const data: EmailRequest = {
      jobNumber: reports.jobNumber,
      revision: latest.revision,
      customerEmail: reports.customerEmail,
      send: (body) => this.api.email(id, body),
    };
    const ref = this.dialog.open<EmailDialog, EmailRequest, ReportSending>(EmailDialog, {
      data,
      width: '520px',
      maxWidth: '96vw',
    });
    const sent = await firstValueFrom(ref.afterClosed());
    if (sent === undefined) return;
    this.notice.set(`Sent to ${sent.to}.`);
    await this.load(id);
  }
}
