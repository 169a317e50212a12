import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import {
  LabSummarySchema,
  pageOf,
  type ChangeLabStatusRequest,
  type CreateLabRequest,
  type LabSummary,
  type ListQuery,
  type Page,
} from '@ohmprint/contracts';
import { quietRequest, queryParams } from '@ohmprint/ui';
import { map, type Observable } from 'rxjs';

const LabPageSchema = pageOf(LabSummarySchema);

/** Lab tenants, as the platform operator manages them. */
@Injectable({ providedIn: 'root' })
export class LabsData {
  private readonly http = inject(HttpClient);

  list(query: ListQuery): Observable<Page<LabSummary>> {
    return this.http.get('/api/operator/labs', { params: queryParams(query) }).pipe(map((r) => LabPageSchema.parse(r)));
  }

  create(body: CreateLabRequest): Observable<LabSummary> {
    return this.http.post('/api/operator/labs', body, { context: quietRequest() }).pipe(map((r) => LabSummarySchema.parse(r)));
  }

  changeStatus(id: string, body: ChangeLabStatusRequest): Observable<LabSummary> {
    return this.http.put(`/api/operator/labs/${id}/status`, body, { context: quietRequest() }).pipe(map((r) => LabSummarySchema.parse(r)));
  }
}
