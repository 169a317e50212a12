import { listQueryOf, listStateParams, onOff, oneOf, oneOfOr, readListState, someOf, type ListSpec } from './list-state';

type Filters = { status: 'open' | 'closed' | null; states: readonly ('a' | 'b' | 'c')[]; unread: boolean; show: 'all' | 'kept' };

const SPEC: ListSpec<Filters> = {
  sorts: ['placedAt', 'status', 'product'],
  sort: 'placedAt',
  dir: 'desc',
  pageSizes: [10, 20, 50],
  filters: { status: oneOf(['open', 'closed']), states: someOf(['a', 'b', 'c'], ['b']), unread: onOff(), show: oneOfOr(['all', 'kept'], 'all') },
};

const url = (query: string) => new URLSearchParams(query);

describe('list state in the URL', () => {
  it('reads a plain URL as the list defaults', () => {
    expect(readListState(SPEC, url(''))).toEqual({
      q: '',
      sort: 'placedAt',
      dir: 'desc',
      page: 1,
      pageSize: 20,
      filters: { status: null, states: ['b'], unread: false, show: 'all' },
    });
  });

  it('reads back every part a shared link carries', () => {
    const state = readListState(SPEC, url('q=Hollin&sort=status&dir=asc&page=3&pageSize=50&status=closed&states=c,a&unread=true&show=kept'));
    expect(state).toEqual({
      q: 'Hollin',
      sort: 'status',
      dir: 'asc',
      page: 3,
      pageSize: 50,
      filters: { status: 'closed', states: ['a', 'c'], unread: true, show: 'kept' },
    });
  });

  it.each([
    ['sort=password', { sort: 'placedAt' }],
    ['dir=sideways', { dir: 'desc' }],
    ['page=0', { page: 1 }],
    ['page=-2', { page: 1 }],
    ['page=2.5', { page: 1 }],
    ['page=1e308', { page: 1 }],
    ['page=99999999999', { page: 1 }],
    ['page=abc', { page: 1 }],
    ['pageSize=7', { pageSize: 20 }],
    ['pageSize=100000', { pageSize: 20 }],
    [`q=${'x'.repeat(201)}`, { q: '' }],
    ['q=%20%20lot%20', { q: 'lot' }],
  ])('reads the unreadable %s as its default', (query, expected) => {
    expect(readListState(SPEC, url(query))).toMatchObject(expected);
  });

  it.each([
    ['status=deleted', { status: null }],
    ['states=a,zzz', { states: ['b'] }],
    ['unread=yes', { unread: false }],
    ['show=everything', { show: 'all' }],
  ])('reads the unknown filter %s as its default', (query, expected) => {
    expect(readListState(SPEC, url(query)).filters).toMatchObject(expected);
  });

  it('tells an empty multi-choice (every value) from a missing one (the default choice)', () => {
    expect(readListState(SPEC, url('states=')).filters.states).toEqual([]);
    expect(readListState(SPEC, url('')).filters.states).toEqual(['b']);
    expect(listStateParams(SPEC, { ...readListState(SPEC, url('')), filters: { ...readListState(SPEC, url('')).filters, states: [] } })['states']).toBe('');
  });

  it('writes defaults as null, so a plain list has a plain URL and stale keys are removed', () => {
    expect(listStateParams(SPEC, readListState(SPEC, url('sort=nonsense&page=0')))).toEqual({
      q: null,
      sort: null,
      dir: null,
      page: null,
      pageSize: null,
      status: null,
      states: null,
      unread: null,
      show: null,
    });
  });

  it('writes what it reads: a link survives the round trip', () => {
    const query = 'q=Hollin&sort=status&dir=asc&page=3&pageSize=50&status=closed&states=a,c&unread=true&show=kept';
    const written = listStateParams(SPEC, readListState(SPEC, url(query)));
    expect(written).toEqual({ q: 'Hollin', sort: 'status', dir: 'asc', page: '3', pageSize: '50', status: 'closed', states: 'a,c', unread: 'true', show: 'kept' });
    const again = new URLSearchParams(Object.entries(written).filter((e): e is [string, string] => e[1] !== null));
    expect(readListState(SPEC, again)).toEqual(readListState(SPEC, url(query)));
  });

  it('keeps two lists on one page apart with a prefix', () => {
    const lots: ListSpec = { sorts: ['distance', 'lotCode'], sort: 'distance', dir: 'desc', prefix: 'lots' };
    const state = readListState(lots, url('page=4&lots.page=2&lots.sort=lotCode'));
    expect(state).toMatchObject({ page: 2, sort: 'lotCode' });
    expect(listStateParams(lots, state)).toMatchObject({ 'lots.page': '2', 'lots.sort': 'lotCode' });
  });

  it('never offers a page size the API refuses', () => {
    const big: ListSpec = { sorts: ['name'], sort: 'name', dir: 'asc', pageSizes: [50, 100, 500] };
    expect(readListState(big, url('pageSize=500')).pageSize).toBe(50);
  });

  it('turns a state into the API query, leaving an empty search out', () => {
    expect(listQueryOf(readListState(SPEC, url('page=2')))).toEqual({ q: undefined, sort: 'placedAt', dir: 'desc', page: 2, pageSize: 20 });
  });
});
