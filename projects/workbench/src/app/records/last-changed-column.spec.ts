import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatSortModule, type Sort } from '@angular/material/sort';
import { MatSortHarness } from '@angular/material/sort/testing';
import { MatTableModule } from '@angular/material/table';
import { MatTableHarness } from '@angular/material/table/testing';
import { describe, expect, it } from 'vitest';
import { LastChangedColumn } from './last-changed-column';

interface Row {
  readonly name: string;
  readonly updatedAt: string;
}

@Component({
  imports: [LastChangedColumn, MatSortModule, MatTableModule],
  template: `
    <table mat-table [dataSource]="rows" matSort (matSortChange)="sorted.set($event)" aria-label="Records">
      <ng-container matColumnDef="name">
        <th mat-header-cell *matHeaderCellDef>Name</th>
        <td mat-cell *matCellDef="let row">{{ row.name }}</td>
      </ng-container>
      <app-last-changed-column />
      <tr mat-header-row *matHeaderRowDef="columns"></tr>
      <tr mat-row *matRowDef="let row; columns: columns"></tr>
    </table>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class TableHost {
  readonly rows: readonly Row[] = [
    { name: 'Alder Creek Land Clearing', updatedAt: '2026-03-02T08:00:00.000Z' },
    { name: 'Harlow Fen Dairy', updatedAt: '2026-11-20T15:30:00.000Z' },
  ];
  readonly columns = ['name', 'updatedAt'];
  readonly sorted = signal<Sort | null>(null);
}

describe('LastChangedColumn', () => {
  it('adds the day of each record’s last change to the table it sits in, and sorts by it', async () => {
    const fixture = TestBed.createComponent(TableHost);
    await fixture.whenStable();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const table = await loader.getHarness(MatTableHarness);
    expect(await (await table.getHeaderRows())[0]!.getCellTextByIndex()).toEqual(['Name', 'Last changed']);
    expect(await table.getCellTextByColumnName()).toEqual({
      name: { text: ['Alder Creek Land Clearing', 'Harlow Fen Dairy'], headerText: ['Name'], footerText: [] },
      updatedAt: { text: ['2 Mar 2026', '20 Nov 2026'], headerText: ['Last changed'], footerText: [] },
    });
    const header = (
      await (await loader.getHarness(MatSortHarness)).getSortHeaders({ label: 'Last changed' })
    )[0]!;
    await header.click();
    expect(fixture.componentInstance.sorted()).toEqual({ active: 'updatedAt', direction: 'asc' });
  });
});
