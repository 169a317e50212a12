import { Location } from '@angular/common';
import { provideLocationMocks } from '@angular/common/testing';
import { ChangeDetectionStrategy, Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Router } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { ListQuery, Page } from '@ohmprint/contracts';
import { Observable, of, throwError } from 'rxjs';
import { provideTestPortal } from '../testing/portal-testing';
import { oneOf } from './list-state';
import { ServerList } from './server-list';

type Status = 'open' | 'closed';
interface Call extends ListQuery {
  status: Status | null;
}

let calls: Call[] = [];
let answer: (query: ListQuery) => Observable<Page<string>> = (q) => of({ items: ['row'], total: 95, page: q.page, pageSize: q.pageSize });

@Component({ selector: 'ohm-things', template: '', changeDetection: ChangeDetectionStrategy.OnPush })
class Things {
  readonly list = new ServerList<string, { status: Status | null }>({
    sorts: ['name', 'age'],
    sort: 'name',
    dir: 'asc',
    filters: { status: oneOf(['open', 'closed']) },
    fetch: (query, f) => {
      calls.push({ ...query, status: f.status });
      return answer(query);
    },
  });
}

/** A page that takes its time to open (a lazy chunk on a busy machine): released by `arrive()`. */
let arrive: () => void = () => undefined;
@Component({ selector: 'ohm-thing', template: '', changeDetection: ChangeDetectionStrategy.OnPush })
class Thing {}

async function open(url: string) {
  const slowly = () => new Promise<boolean>((resolve) => (arrive = () => resolve(true)));
  TestBed.configureTestingModule({
    providers: [...provideTestPortal({ routes: [{ path: 'things', component: Things }, { path: 'things/:id', component: Thing, canActivate: [slowly] }] }), provideLocationMocks()],
  });
  const harness = await RouterTestingHarness.create();
  // as the app's initial navigation does: Back and Forward become navigations
  TestBed.inject(Router).setUpLocationChangeListener();
  const page = await harness.navigateByUrl(url, Things);
  return { harness, list: page.list, location: TestBed.inject(Location) };
}

const settle = () => new Promise((resolve) => setTimeout(resolve));

describe('ServerList', () => {
  beforeEach(() => {
    calls = [];
    answer = (q) => of({ items: ['row'], total: 95, page: q.page, pageSize: q.pageSize });
  });

  it('opens a shared link on the list it describes, with one request', async () => {
    const { list } = await open('/things?q=ridge&sort=age&dir=desc&page=3&pageSize=50&status=closed');
    expect(calls).toEqual([{ q: 'ridge', sort: 'age', dir: 'desc', page: 3, pageSize: 50, status: 'closed' }]);
    expect(list.state()).toMatchObject({ q: 'ridge', sort: 'age', dir: 'desc', page: 3, pageSize: 50 });
    expect(list.searchText()).toBe('ridge');
    expect(list.rows()).toEqual(['row']);
    expect(list.total()).toBe(95);
  });

  it('opens a link full of nonsense on the default list, without an error', async () => {
    const { list } = await open('/things?sort=%00drop&dir=up&page=-1&pageSize=3&status=gone');
    expect(calls).toEqual([{ q: undefined, sort: 'name', dir: 'asc', page: 1, pageSize: 20, status: null }]);
    expect(list.failed()).toBe(false);
  });

  it('writes each choice into the URL, leaving defaults out, and fetches what the URL says', async () => {
    const { harness, list, location } = await open('/things');
    list.filter({ status: 'open' });
    await harness.fixture.whenStable();
    expect(location.path()).toBe('/things?status=open');
    list.sortBy({ active: 'age', direction: 'desc' });
    await harness.fixture.whenStable();
    expect(location.path()).toBe('/things?status=open&sort=age&dir=desc');
    list.turn({ pageIndex: 1, pageSize: 20, length: 95 });
    await harness.fixture.whenStable();
    expect(location.path()).toBe('/things?status=open&sort=age&dir=desc&page=2');
    expect(calls.at(-1)).toEqual({ q: undefined, sort: 'age', dir: 'desc', page: 2, pageSize: 20, status: 'open' });
    list.search('  lot 7 ');
    await harness.fixture.whenStable();
    // a new search starts again from the first page
    expect(location.path()).toBe('/things?status=open&sort=age&dir=desc&q=lot%207');
  });

  it('keeps other query parameters of the page', async () => {
    const { harness, list, location } = await open('/things?code=OP-1');
    list.turn({ pageIndex: 2, pageSize: 20, length: 95 });
    await harness.fixture.whenStable();
    expect(location.path()).toBe('/things?code=OP-1&page=3');
  });

  it('steps back and forward through what the user chose', async () => {
    const { harness, list, location } = await open('/things');
    list.filter({ status: 'closed' });
    await harness.fixture.whenStable();
    list.turn({ pageIndex: 3, pageSize: 20, length: 95 });
    await harness.fixture.whenStable();
    expect(calls.length).toBe(3);
    location.back();
    await settle();
    await harness.fixture.whenStable();
    expect(list.state()).toMatchObject({ page: 1, filters: { status: 'closed' } });
    expect(calls.at(-1)).toMatchObject({ page: 1, status: 'closed' });
    location.back();
    await settle();
    await harness.fixture.whenStable();
    expect(list.state()).toMatchObject({ page: 1, filters: { status: null } });
    location.forward();
    await settle();
    await harness.fixture.whenStable();
    expect(list.filters()).toEqual({ status: 'closed' });
    expect(calls.length).toBe(6);
  });

  it('replaces the history entry while a search is refined, so Back leaves the search', async () => {
    const { harness, list, location } = await open('/things');
    list.search('hol');
    await harness.fixture.whenStable();
    list.search('hollin');
    await harness.fixture.whenStable();
    expect(location.path()).toBe('/things?q=hollin');
    location.back();
    await settle();
    await harness.fixture.whenStable();
    expect(location.path()).toBe('/things');
    expect(list.searchText()).toBe('');
  });

  it('opens the last page when a link points past the end', async () => {
    answer = (q) => of({ items: q.page > 5 ? [] : ['row'], total: 95, page: q.page, pageSize: q.pageSize });
    const { harness, list, location } = await open('/things?page=40');
    await harness.fixture.whenStable();
    await settle();
    expect(location.path()).toBe('/things?page=5');
    expect(list.state().page).toBe(5);
    expect(list.rows()).toEqual(['row']);
  });

  it('says the list failed and keeps its rows when a request fails, and fetches again on reload', async () => {
    const { list } = await open('/things');
    answer = () => throwError(() => new Error('offline'));
    list.reload();
    expect(list.failed()).toBe(true);
    expect(list.rows()).toEqual(['row']);
    answer = (q) => of({ items: ['fresh'], total: 1, page: q.page, pageSize: q.pageSize });
    list.reload();
    expect(list.failed()).toBe(false);
    expect(list.rows()).toEqual(['fresh']);
  });

  it('lets a followed row link finish: a search settling meanwhile does not pull the person back', async () => {
    const { harness, list, location } = await open('/things');
    const router = TestBed.inject(Router);
    const leaving = router.navigateByUrl('/things/42');
    await settle();
    list.search('ridge');
    arrive();
    expect(await leaving).toBe(true);
    await harness.fixture.whenStable();
    expect(location.path()).toBe('/things/42');
  });

  it('does not navigate when nothing changed', async () => {
    const { list } = await open('/things?status=open');
    const navigate = jest.spyOn(TestBed.inject(Router), 'navigate');
    list.filter({ status: 'open' });
    list.search('');
    expect(navigate).not.toHaveBeenCalled();
  });
});
