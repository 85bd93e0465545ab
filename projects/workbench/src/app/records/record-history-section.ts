import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { ChangeHistory } from './change-history';
import type { FieldDescriptions } from './record-fields';
import type { RecordView } from './record-page';

/** The last section of a record's page: its change history, fetched and retried by the page's RecordView. */
@Component({
  selector: 'app-record-history-section',
  imports: [ChangeHistory],
  template: `
    <section aria-labelledby="history-heading">
      <h2 id="history-heading">Change history</h2>
      <app-change-history
        [noun]="noun()"
        [changes]="view().changes()"
        [failed]="view().historyError()"
        [fields]="fields()"
        (retry)="view().reloadHistory()"
      />
    </section>
  `,
  styles: `
    :host {
      display: block;
    }

    section {
      margin-top: 32px;
    }

    h2 {
      font: var(--mat-sys-title-large);
      margin: 0 0 12px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RecordHistorySection {
  readonly view = input.required<Pick<RecordView<never>, 'changes' | 'historyError' | 'reloadHistory'>>();
  /** The record as the history's sentences name it: "customer", "machine family". */
  readonly noun = input.required<string>();
  /** How the history names the record's fields. */
  readonly fields = input<FieldDescriptions>({});
}
