import {
  afterNextRender,
  ChangeDetectionStrategy,
  Component,
  type ElementRef,
  inject,
  type OnDestroy,
  signal,
  viewChild,
} from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import SignaturePad from 'signature_pad';
import { firstValueFrom, type Observable } from 'rxjs';
import { BusyButton } from '../forms/busy-button';
import { applyServerErrors, httpErrorMessage, problemOf } from '../shell/server-errors';
import type { JobReports, SignReport } from './reports.api';

/** What the signing dialog is opened with. */
export interface SignatureRequest {
  /** The job's number, for the heading ("J-000123"). */
  readonly jobNumber: string;
  /** Sends the signature; the dialog shows the server's refusals at their fields. */
  readonly sign: (body: SignReport) => Observable<JobReports>;
}

/** The message under the pad when Sign is pressed before anything is drawn. */
export const DRAWING_NEEDED =
  'Draw the signature on the pad with a finger, a pen or the mouse: it cannot be typed.';

/**
 * The customer signs the report on the technician's tablet: their name, and their signature drawn on a
 * signature_pad canvas sized for a tablet (as wide as the dialog, 220 px high). Everything but the drawing
 * works from the keyboard (the name, Clear, Cancel, Sign); Sign on an empty pad says a drawing is needed. The
 * dialog sends the signature itself, so that a refusal shows on the field it names, and closes with the
 * report's revisions once the server has frozen the signed revision.
 */
@Component({
  selector: 'app-signature-dialog',
  imports: [
    BusyButton,
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    ReactiveFormsModule,
  ],
  template: `
    <h2 mat-dialog-title>
      <span>Customer signs report</span>&ngsp;<span class="nowrap">{{ data.jobNumber }}</span>
    </h2>
    <mat-dialog-content>
      <p class="lead">
        By signing, the customer confirms the work recorded in the report. The signed report is kept as it is;
        a later change of the job makes a new revision to sign.
      </p>
      <mat-form-field class="name">
        <mat-label>Name of the person who signs</mat-label>
        <input matInput [formControl]="name" autocomplete="name" maxlength="100" data-testid="signer-name" />
        @if (name.hasError('server')) {
          <mat-error>{{ name.getError('server') }}</mat-error>
        } @else if (name.invalid) {
          <mat-error>Enter the name of the person who signs.</mat-error>
        }
      </mat-form-field>
      <div class="pad" [class.pad--error]="padError() !== null">
        <canvas
          #canvas
          class="pad__canvas"
          role="img"
          aria-label="Signature pad: the customer draws their signature here with a finger, a pen or the mouse"
          aria-describedby="pad-hint pad-error"
          data-testid="signature-pad"
        ></canvas>
        <span class="pad__line" aria-hidden="true"></span>
      </div>
      <p id="pad-hint" class="hint">
        @if (drawn()) {
          Signature drawn. Clear it to sign again.
        } @else {
          Sign above the line.
        }
      </p>
      <p id="pad-error" class="error" role="alert" data-testid="pad-error">
        @if (padError(); as message) {
          <mat-icon aria-hidden="true" svgIcon="error" />
          {{ message }}
        }
      </p>
      @if (formError(); as message) {
        <p class="error" role="alert">{{ message }}</p>
      }
    </mat-dialog-content>
    <mat-dialog-actions>
      <button matButton type="button" (click)="clear()" [disabled]="busy()">
        <mat-icon aria-hidden="true" svgIcon="backspace" />
        Clear
      </button>
      <span class="spacer"></span>
      <button matButton type="button" mat-dialog-close [disabled]="busy()">Cancel</button>
      <app-busy-button label="Sign" busyLabel="Signing…" icon="draw" [busy]="busy()" (click)="submit()" />
    </mat-dialog-actions>
  `,
  styles: `
    .lead {
      margin: 0 0 12px;
    }
    .nowrap {
      white-space: nowrap;
    }
    .error mat-icon {
      flex: none;
    }
    .name {
      width: 100%;
    }
    .pad {
      position: relative;
      border: 2px solid var(--mat-sys-outline);
      border-radius: 8px;
      background: #fff;
      touch-action: none;
    }
    .pad--error {
      border-color: var(--mat-sys-error);
    }
    .pad__canvas {
      display: block;
      width: 100%;
      height: 220px;
      cursor: crosshair;
    }
    .pad__line {
      position: absolute;
      left: 24px;
      right: 24px;
      bottom: 48px;
      border-bottom: 1px solid var(--mat-sys-outline-variant);
      pointer-events: none;
    }
    .hint {
      margin: 6px 0 0;
      color: var(--mat-sys-on-surface-variant);
    }
    .error {
      display: flex;
      gap: 6px;
      align-items: flex-start;
      min-height: 1.5em;
      margin: 4px 0 0;
      color: var(--mat-sys-error);
    }
    mat-dialog-actions {
      gap: 8px;
      flex-wrap: wrap;
      --mat-button-text-container-height: 48px;
    }
    .spacer {
      flex: 1;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SignatureDialog implements OnDestroy {
  protected readonly data = inject<SignatureRequest>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<SignatureDialog, JobReports>>(MatDialogRef);
  private readonly canvas = viewChild.required<ElementRef<HTMLCanvasElement>>('canvas');
  private pad: SignaturePad | null = null;
  private readonly resize = () => this.fitCanvas();

  /** The fields the server names in its refusals: `signerName` (the pad's `signaturePng` has its own line). */
  private readonly form = new FormGroup({
    signerName: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.pattern(/\S/)],
    }),
  });
  protected readonly name = this.form.controls.signerName;
  protected readonly drawn = signal(false);
  protected readonly padError = signal<string | null>(null);
  protected readonly formError = signal<string | null>(null);
  protected readonly busy = signal(false);

  constructor() {
    afterNextRender(() => {
      const canvas = this.canvas().nativeElement;
      this.pad = new SignaturePad(canvas, { minWidth: 0.8, maxWidth: 2.6, penColor: '#0b1f44' });
      this.pad.addEventListener('endStroke', () => {
        this.drawn.set(!this.pad!.isEmpty());
        if (this.drawn()) this.padError.set(null);
      });
      this.fitCanvas();
      window.addEventListener('resize', this.resize);
    });
  }

  ngOnDestroy(): void {
    window.removeEventListener('resize', this.resize);
    this.pad?.off();
  }

  /** Sizes the canvas's pixels to its box and the screen's density, keeping what was drawn. */
  private fitCanvas(): void {
    const canvas = this.canvas().nativeElement;
    const pad = this.pad;
    if (pad === null || canvas.offsetWidth === 0) return;
    const ratio = Math.max(window.devicePixelRatio || 1, 1);
    const strokes = pad.toData();
    canvas.width = canvas.offsetWidth * ratio;
    canvas.height = canvas.offsetHeight * ratio;
    canvas.getContext('2d')!.scale(ratio, ratio);
    pad.clear();
    pad.fromData(strokes);
  }

  protected clear(): void {
    this.pad?.clear();
    this.drawn.set(false);
  }

  protected async submit(): Promise<void> {
    this.formError.set(null);
    this.name.markAsTouched();
    const empty = this.pad === null || this.pad.isEmpty();
    this.padError.set(empty ? DRAWING_NEEDED : null);
    if (this.name.invalid || empty) return;
    this.busy.set(true);
    try {
      const reports = await firstValueFrom(
        this.data.sign({
          signerName: this.name.value.trim(),
          signaturePng: this.pad!.toDataURL('image/png'),
        }),
      );
      this.ref.close(reports);
    } catch (error) {
      const problem = problemOf(error);
      const onPad = problem?.errors?.filter((item) => item.path === 'signaturePng') ?? [];
      if (onPad.length > 0) this.padError.set(onPad.map((item) => item.message).join(' '));
      const unplaced = applyServerErrors(this.form, {
        ...(problem ?? { type: 'about:blank', title: '', status: 0 }),
        errors: problem?.errors?.filter((item) => item.path !== 'signaturePng') ?? [],
      });
      if (unplaced.length > 0) this.formError.set(unplaced.join(' '));
      else if ((problem?.errors?.length ?? 0) === 0) this.formError.set(httpErrorMessage(error));
    } finally {
      this.busy.set(false);
    }
  }
}
