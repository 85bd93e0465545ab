import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { ReactiveFormsModule } from '@angular/forms';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import type { RecordList } from './record-list';

/**
 * The search field and archived filter above a records list, with the list's own filters projected
 * between them. Its host is the flex row, so that projected filters (class `filter`) wrap with the rest.
 */
@Component({
  selector: 'app-record-list-filters',
  imports: [MatButtonToggleModule, MatFormFieldModule, MatIconModule, MatInputModule, ReactiveFormsModule],
  template: `
    <mat-form-field appearance="outline" class="search" subscriptSizing="dynamic">
      <mat-label>{{ searchLabel() }}</mat-label>
      <mat-icon matPrefix aria-hidden="true" svgIcon="search" />
      <input matInput type="search" autocomplete="off" [formControl]="records().search" />
      <mat-hint>{{ searchHint() }}</mat-hint>
    </mat-form-field>
    <ng-content />
    <mat-button-toggle-group
      hideSingleSelectionIndicator
      [value]="records().state().archived"
      (change)="records().showArchived($event.value)"
      [attr.aria-label]="archivedLabel()"
    >
      <mat-button-toggle value="false">In use</mat-button-toggle>
      <mat-button-toggle value="true">Archived</mat-button-toggle>
      <mat-button-toggle value="all">All</mat-button-toggle>
    </mat-button-toggle-group>
  `,
  styleUrl: './record-list-filters.scss',
  host: { class: 'filters' },
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RecordListFilters {
  readonly records = input.required<RecordList<unknown>>();
  /** "Search customers". */
  readonly searchLabel = input.required<string>();
  /** What the search looks through. */
  readonly searchHint = input.required<string>();
  /** "Which customers to show". */
  readonly archivedLabel = input.required<string>();
}
