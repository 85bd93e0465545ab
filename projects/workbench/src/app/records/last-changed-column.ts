import { DatePipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  inject,
  type OnDestroy,
  type OnInit,
  viewChild,
} from '@angular/core';
import { MatSortModule } from '@angular/material/sort';
import {
  MatCellDef,
  MatColumnDef,
  MatHeaderCellDef,
  MatTable,
  MatTableModule,
} from '@angular/material/table';

/**
 * A records table's "Last changed" column (`updatedAt`), sortable, the day of the record's last change:
 * `<app-last-changed-column />` inside the table, `'updatedAt'` among its columns. It adds its column to the
 * table it sits in, as Material's text column does.
 */
@Component({
  selector: 'app-last-changed-column',
  imports: [DatePipe, MatSortModule, MatTableModule],
  template: `
    <ng-container matColumnDef="updatedAt">
      <th mat-header-cell *matHeaderCellDef mat-sort-header sortActionDescription="Sort by last change">
        Last changed
      </th>
      <td mat-cell *matCellDef="let row">{{ asChanged(row).updatedAt | date: 'd MMM y' }}</td>
    </ng-container>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class LastChangedColumn implements OnInit, OnDestroy {
  private readonly table = inject(MatTable);
  private readonly columnDef = viewChild.required(MatColumnDef);
  private readonly cell = viewChild.required(MatCellDef);
  private readonly headerCell = viewChild.required(MatHeaderCellDef);

  ngOnInit(): void {
    const columnDef = this.columnDef();
    columnDef.cell = this.cell();
    columnDef.headerCell = this.headerCell();
    this.table.addColumnDef(columnDef);
  }

  ngOnDestroy(): void {
    this.table.removeColumnDef(this.columnDef());
  }

  // The table's row templates are untyped; this gives their rows a type again.
  protected asChanged(row: { readonly updatedAt: string }): { readonly updatedAt: string } {
    return row;
  }
}
