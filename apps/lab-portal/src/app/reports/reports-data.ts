import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import {
  ReportDetailSchema,
  ReportSummarySchema,
  pageOf,
  type AmendReportRequest,
  type ListQuery,
  type Page,
  type ReportDetail,
  type ReportStatus,
  type ReportSummary,
} from '@ohmprint/contracts';
import { queryParams, quietRequest } from '@ohmprint/ui';
import { map, type Observable } from 'rxjs';

const ReportPageSchema = pageOf(ReportSummarySchema);

@Injectable({ providedIn: 'root' })
export class ReportsData {
  private readonly http = inject(HttpClient);

  list(query: ListQuery, status: ReportStatus | null): Observable<Page<ReportSummary>> {
    let params = queryParams(query);
    if (status) params = params.set('status', status);
    return this.http.get('/api/lab/reports', { params }).pipe(map((r) => ReportPageSchema.parse(r)));
  }

  get(id: string): Observable<ReportDetail> {
    return this.http.get(`/api/lab/reports/${id}`).pipe(map((r) => ReportDetailSchema.parse(r)));
  }

  amend(id: string, body: AmendReportRequest): Observable<ReportDetail> {
    return this.http.post(`/api/lab/reports/${id}/amend`, body, { context: quietRequest() }).pipe(map((r) => ReportDetailSchema.parse(r)));
  }

  revoke(id: string, reason: string): Observable<ReportDetail> {
    return this.http.post(`/api/lab/reports/${id}/revoke`, { reason }, { context: quietRequest() }).pipe(map((r) => ReportDetailSchema.parse(r)));
  }
}
