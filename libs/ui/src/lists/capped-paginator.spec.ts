import { ChangeDetectionStrategy, Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatPaginatorIntl, MatPaginatorModule } from '@angular/material/paginator';
import { RouterTestingHarness } from '@angular/router/testing';
import { SEARCH_TOTAL_CAP, type ListQuery, type Page } from '@ohmprint/contracts';
import { of } from 'rxjs';
import { provideTestPortal } from '../testing/portal-testing';
import { CappedPaginatorIntl } from './capped-paginator-intl';
import { ServerList } from './server-list';

/** What the server answers: a search counted to its cap, or an exact total just past it. */
let answer: (query: ListQuery) => Page<string> = () => ({ items: [], total: 0, page: 1, pageSize: 20 });

@Component({
  selector: 'ohm-paged-things',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatPaginatorModule],
  template: `<mat-paginator [length]="list.total()" [pageIndex]="list.state().page - 1" [pageSize]="list.state().pageSize"
    [pageSizeOptions]="list.pageSizes" (page)="list.turn($event)" aria-label="Thing pages" />`,
})
class PagedThings {
  readonly list = new ServerList<string>({ sorts: ['name'], sort: 'name', dir: 'asc', fetch: (query) => of(answer(query)) });
}

async function open(url: string) {
  TestBed.configureTestingModule({
    providers: [...provideTestPortal({ routes: [{ path: 'things', component: PagedThings }] }), { provide: MatPaginatorIntl, useClass: CappedPaginatorIntl }],
  });
  const harness = await RouterTestingHarness.create();
  await harness.navigateByUrl(url, PagedThings);
  await harness.fixture.whenStable();
  const el = harness.routeNativeElement as HTMLElement;
  return {
    label: () => el.querySelector('.mat-mdc-paginator-range-label')?.textContent?.trim(),
    canGoOn: () => {
      const next = el.querySelector('button.mat-mdc-paginator-navigation-next') as HTMLButtonElement;
      return !next.disabled && next.getAttribute('aria-disabled') !== 'true';
    },
  };
}

describe('the paginator under a capped total', () => {
  it('reads "of 1,000+" for a search past its count cap, and still offers the page after the cap', async () => {
    answer = (q) => ({ items: ['row'], total: SEARCH_TOTAL_CAP, totalIsLowerBound: true, page: q.page, pageSize: q.pageSize });
    const first = await open('/things?q=demo');
    expect(first.label()).toBe('1 – 20 of 1,000+');
    expect(first.canGoOn()).toBe(true);
    TestBed.resetTestingModule();
    // page 50 holds matches 981–1,000; there are more, so page 51 can be asked for
    const fiftieth = await open('/things?q=demo&page=50');
    expect(fiftieth.label()).toBe('981 – 1,000 of 1,000+');
    expect(fiftieth.canGoOn()).toBe(true);
  });

  it('reads an exact total just past the cap as exact, with digit grouping', async () => {
    answer = (q) => ({ items: ['row'], total: SEARCH_TOTAL_CAP + 1, page: q.page, pageSize: q.pageSize });
    const last = await open('/things?page=51');
    expect(last.label()).toBe('1,001 – 1,001 of 1,001');
    expect(last.canGoOn()).toBe(false);
  });
});
