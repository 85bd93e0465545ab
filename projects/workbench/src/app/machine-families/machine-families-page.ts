import { wideTable } from '../shell/wide-table';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { AuthSession } from '../auth/auth-session';
import { LastChangedColumn } from '../records/last-changed-column';
import { recordList } from '../records/record-list';
import { RecordListFilters } from '../records/record-list-filters';
import { ListPage } from '../shell/list-page';
import { formatNumber, ROTOR_TYPE_LABELS } from '../records/record-labels';
import { MachineFamiliesApi, type MachineFamily, type MachineFamilySortField } from './machine-families.api';

/**
 * The shop's machine families (a model range whose rotors answer a weight alike): searched, sorted and paged
 * by the server, the query kept in the address.
 */
@Component({
  selector: 'app-machine-families-page',
  imports: [
    LastChangedColumn,
    ListPage,
    MatButtonModule,
    MatIconModule,
    MatSortModule,
    MatTableModule,
    RecordListFilters,
    RouterLink,
  ],
  templateUrl: './machine-families-page.html',
  styleUrl: './machine-families-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MachineFamiliesPage {
  protected readonly session = inject(AuthSession);
  private readonly api = inject(MachineFamiliesApi);

  protected readonly records = recordList<MachineFamily, MachineFamilySortField>({
    sortFields: ['name', 'rotorType', 'updatedAt'],
    load: (query) => this.api.list(query),
    nouns: ['family', 'families'],
  });
  protected readonly state = this.records.state;

  /** Below the wide-table width the speed and planes move under the name, so that the table fits a phone. */
  private readonly wide = wideTable();
  protected readonly columns = computed(() =>
    this.wide()
      ? ['name', 'rotorType', 'nominalSpeedRpm', 'planeCount', 'machineCount', 'updatedAt']
      : ['name', 'machineCount'],
  );
  protected readonly rotorTypes = ROTOR_TYPE_LABELS;
  protected readonly formatNumber = formatNumber;

  // The table's row templates are untyped; this gives their rows a type again.
  protected asFamily(row: MachineFamily): MachineFamily {
    return row;
  }
}
