import { NgTemplateOutlet } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  contentChild,
  input,
  type Signal,
  TemplateRef,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { RouterLink } from '@angular/router';
import { ErrorBanner } from '../forms/error-banner';
import { BusyButton } from '../forms/busy-button';

/** What RecordFormFrame reads of a RecordForm: whether the record to edit is on its way or failed. */
export interface RecordFormLoad {
  readonly loadError: Signal<string | null>;
  readonly loading: Signal<boolean>;
}

/**
 * A record's form page below its header: why the record could not be fetched (with the way back to the
 * list), the spinner while it comes, and then the page's own form, given as an `<ng-template>` so that it
 * is made only once the record is there (as its fields take their first values then). The form stays in
 * the page's template so that its fields find their form group.
 */
@Component({
  selector: 'app-record-form-frame',
  imports: [ErrorBanner, MatButtonModule, MatProgressSpinnerModule, NgTemplateOutlet, RouterLink],
  template: `
    @if (editing().loadError(); as message) {
      <app-error-banner
        class="problem"
        [lead]="'The ' + noun() + ' could not be fetched.'"
        [message]="message"
      >
        <a errorBannerAction matButton="outlined" [routerLink]="listLink()">{{ backLabel() }}</a>
      </app-error-banner>
    } @else if (editing().loading()) {
      <p class="state" role="status">
        <mat-spinner diameter="24" aria-hidden="true" />
        Fetching the {{ noun() }}…
      </p>
    } @else {
      <ng-container [ngTemplateOutlet]="form()" />
    }
  `,
  styleUrl: './record-form-frame.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RecordFormFrame {
  readonly editing = input.required<RecordFormLoad>();
  /** The record as the sentences name it: "customer", "machine family". */
  readonly noun = input.required<string>();
  /** The list the way back leads to, `/customers`. */
  readonly listLink = input.required<string>();
  /** "Back to the customers". */
  readonly backLabel = input.required<string>();
  protected readonly form = contentChild.required(TemplateRef);
}

/**
 * Why the server refused the form, above its fields. RecordForm focuses it (`.form-error`) when no field is
 * at fault, so it takes the focus but no place in the tab order.
 */
@Component({
  selector: 'app-record-form-error',
  imports: [ErrorBanner],
  template: `
    @if (message(); as message) {
      <app-error-banner class="form-error" [message]="message" focusable />
    }
  `,
  styleUrl: './record-form-frame.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RecordFormError {
  readonly message = input.required<string | null>();
}

/**
 * The bottom of a record's form: Cancel back to where the person came from, and the submit button, which
 * shows a spinner and "Saving…" while the record is on its way and cannot be pressed twice.
 */
@Component({
  selector: 'app-record-save-bar',
  imports: [BusyButton, MatButtonModule, RouterLink],
  template: `
    <div class="save-bar">
      <a matButton [routerLink]="cancelLink()">Cancel</a>
      <app-busy-button type="submit" [busy]="busy()" [label]="saveLabel()" busyLabel="Saving…" />
    </div>
  `,
  styleUrl: './record-form-frame.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RecordSaveBar {
  /** Where Cancel leads: the list for a new record, the record's page for a change. */
  readonly cancelLink = input.required<string | readonly unknown[]>();
  readonly busy = input.required<boolean>();
  /** "Add the customer", "Save the changes". */
  readonly saveLabel = input.required<string>();
}
