import { HttpParams } from '@angular/common/http';
import type { ListQuery } from '@ohmprint/contracts';

/** `?q=&sort=&dir=&page=&pageSize=` as every list endpoint reads it; an empty search is left out. */
export function queryParams(query: ListQuery): HttpParams {
  let params = new HttpParams()
    .set('sort', query.sort)
    .set('dir', query.dir)
    .set('page', query.page)
    .set('pageSize', query.pageSize);
  if (query.q) params = params.set('q', query.q);
  return params;
}
