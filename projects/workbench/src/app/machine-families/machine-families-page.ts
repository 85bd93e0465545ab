import { BreakpointObserver } from '@angular/cdk/layout';
import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule, type PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { MatSortModule, type Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { map } from 'rxjs';
import { AuthSession } from '../auth/auth-session';
import { apiListQuery, ARCHIVED_NOUNS, listCount, listQuery, PAGE_SIZES } from '../records/list-query';
import { pagedList } from '../records/paged-list';
import { formatNumber, ROTOR_TYPE_LABELS } from '../records/record-labels';
import type { ArchivedFilter } from '../records/records-api';
import { searchBox } from '../records/search-box';
import { httpErrorMessage } from '../shell/server-errors';
import { MachineFamiliesApi, type MachineFamily, type MachineFamilySortField } from './machine-families.api';

/** Below this width the speed and planes move under the name, so that the table fits a phone. */
const WIDE_TABLE = '(min-width: 720px)';

/**
 * The shop's machine families (a model range whose rotors answer a weight alike): searched, sorted and paged
 * by the server, the query kept in the address.
 */
@Component({
  selector: 'app-machine-families-page',
  imports: [
    DatePipe,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatProgressSpinnerModule,
    MatSortModule,
    MatTableModule,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './machine-families-page.html',
  styleUrl: './machine-families-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MachineFamiliesPage {
  protected readonly session = inject(AuthSession);
  private readonly api = inject(MachineFamiliesApi);

  protected readonly query = listQuery<MachineFamilySortField>({
    sortFields: ['name', 'rotorType', 'updatedAt'],
  });
  protected readonly state = this.query.state;
  protected readonly list = pagedList(
    () => apiListQuery(this.state()),
    (query) => this.api.list(query),
  );
  protected readonly search = searchBox(
    computed(() => this.state().q),
    (q) => this.query.change({ q }, { replaceUrl: true }),
  );
  protected readonly rows = computed<readonly MachineFamily[]>(() => this.list.page()?.items ?? []);

  private readonly wide = toSignal(
    inject(BreakpointObserver)
      .observe(WIDE_TABLE)
      .pipe(map((state) => state.matches)),
    { initialValue: true },
  );
  protected readonly columns = computed(() =>
    this.wide()
      ? ['name', 'rotorType', 'nominalSpeedRpm', 'planeCount', 'machineCount', 'updatedAt']
      : ['name', 'machineCount'],
  );
  protected readonly pageSizes = PAGE_SIZES;
  protected readonly rotorTypes = ROTOR_TYPE_LABELS;
  protected readonly formatNumber = formatNumber;
  protected readonly httpErrorMessage = httpErrorMessage;
  protected readonly archivedNoun = computed(() => ARCHIVED_NOUNS[this.state().archived]);

  protected countSentence(total: number): string {
    return listCount(total, ['family', 'families'], this.state());
  }

  protected sortBy(sort: Sort): void {
    this.query.change({
      sort: sort.active as MachineFamilySortField,
      order: sort.direction === 'desc' ? 'desc' : 'asc',
    });
  }

  protected showArchived(archived: ArchivedFilter): void {
    this.query.change({ archived });
  }

  protected turnPage(event: PageEvent): void {
    this.query.change({ page: event.pageIndex + 1, pageSize: event.pageSize });
  }

  // The table's row templates are untyped; this gives their rows a type again.
  protected asFamily(row: MachineFamily): MachineFamily {
    return row;
  }

  protected readonly trackById = (_index: number, family: MachineFamily): number => family.id;
}
