import { HttpErrorResponse } from '@angular/common/http';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatPaginatorHarness } from '@angular/material/paginator/testing';
import type { PageEvent } from '@angular/material/paginator';
import { describe, expect, it } from 'vitest';
import { type ListPaging, ListPage, type ListSource } from './list-page';

@Component({
  imports: [ListPage],
  template: `
    <app-list-page
      heading="Customers"
      noun="customers"
      [list]="list"
      [count]="count()"
      [paging]="paging()"
      [empty]="empty()"
    >
      <p listLead class="lead">Who the shop balances for.</p>
      <a listAction href="/customers/new">Add a customer</a>
      <div listFilters class="filters">Search</div>
      <p listBefore class="before">Before the list</p>
      <p listEmpty class="nothing">No customers yet.</p>
      <table aria-label="Customers">
        <tr>
          <td>Ashgrove Mill</td>
        </tr>
      </table>
      <p listAfter class="after">After the list</p>
    </app-list-page>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class PageHost {
  readonly error = signal<unknown>(undefined);
  readonly loading = signal(true);
  readonly ready = signal(false);
  readonly reloads = signal(0);
  readonly list: ListSource = {
    error: this.error,
    loading: this.loading,
    ready: this.ready,
    reload: () => this.reloads.set(this.reloads() + 1),
  };
  readonly count = signal<string | null>('2 customers.');
  readonly turned = signal<PageEvent | null>(null);
  readonly paging = signal<ListPaging | null>({
    length: 60,
    pageIndex: 0,
    pageSize: 25,
    pageSizes: [25, 50],
    turnPage: (event) => this.turned.set(event),
  });
  readonly empty = signal(false);
}

async function render() {
  TestBed.configureTestingModule({
    providers: [{ provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } }],
  });
  const fixture = TestBed.createComponent(PageHost);
  await fixture.whenStable();
  const element = fixture.nativeElement as HTMLElement;
  return {
    fixture,
    host: fixture.componentInstance,
    element,
    loader: TestbedHarnessEnvironment.loader(fixture),
  };
}

describe('ListPage', () => {
  it('heads the page with its lead, action and filters, and says it is fetching before the first answer', async () => {
    const { element } = await render();
    expect(element.querySelector('h1')?.textContent).toBe('Customers');
    expect(element.querySelector('header .lead')?.textContent).toBe('Who the shop balances for.');
    expect(element.querySelector('header a')?.textContent).toBe('Add a customer');
    expect(element.querySelector('.filters')).not.toBeNull();
    expect(element.querySelector('[role=status]')?.textContent?.trim()).toBe('Fetching the customers…');
    expect(element.querySelector('table')).toBeNull();
  });

  it('shows the list with its count, loading bar and paginator, and turns pages', async () => {
    const { fixture, host, element, loader } = await render();
    host.ready.set(true);
    await fixture.whenStable();
    expect(element.querySelector('.count')?.getAttribute('aria-live')).toBe('polite');
    expect(element.querySelector('.count')?.textContent).toBe('2 customers.');
    expect(element.querySelector('.table-wrap table')?.textContent).toContain('Ashgrove Mill');
    expect(element.querySelector('mat-progress-bar')?.getAttribute('aria-label')).toBe('Fetching customers');
    expect(element.querySelector('.before')).not.toBeNull();
    expect(element.querySelector('.after')).not.toBeNull();
    expect(element.querySelector('.nothing')).toBeNull();
    const paginator = await loader.getHarness(MatPaginatorHarness);
    await paginator.goToNextPage();
    expect(host.turned()?.pageIndex).toBe(1);

    host.loading.set(false);
    host.paging.set(null);
    host.count.set(null);
    await fixture.whenStable();
    expect(element.querySelector('mat-progress-bar')).toBeNull();
    expect(element.querySelector('mat-paginator')).toBeNull();
    expect(element.querySelector('.count')).toBeNull();
  });

  it('shows the empty state instead of the table', async () => {
    const { fixture, host, element } = await render();
    host.ready.set(true);
    host.empty.set(true);
    await fixture.whenStable();
    expect(element.querySelector('.nothing')?.textContent).toBe('No customers yet.');
    expect(element.querySelector('.table-wrap')).toBeNull();
  });

  it('says why the list could not be fetched, and tries again', async () => {
    const { fixture, host, element, loader } = await render();
    host.error.set(new HttpErrorResponse({ status: 0 }));
    host.loading.set(false);
    await fixture.whenStable();
    expect(element.querySelector('[role=alert]')?.textContent).toContain(
      'The customers could not be fetched. The server cannot be reached.',
    );
    await (await loader.getHarness(MatButtonHarness.with({ text: /Try again/ }))).click();
    expect(host.reloads()).toBe(1);
  });

  it('keeps the list on screen when a later fetch fails', async () => {
    const { fixture, host, element } = await render();
    host.ready.set(true);
    host.error.set(new HttpErrorResponse({ status: 0 }));
    await fixture.whenStable();
    expect(element.querySelector('[role=alert]')).toBeNull();
    expect(element.querySelector('table')).not.toBeNull();
  });
});
