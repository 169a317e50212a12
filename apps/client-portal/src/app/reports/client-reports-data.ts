import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { ReportSummarySchema, pageOf, type ListQuery, type Page, type ReportSummary } from '@ohmprint/contracts';
import { Notifier, queryParams } from '@ohmprint/ui';
import { map, type Observable } from 'rxjs';

const ReportPageSchema = pageOf(ReportSummarySchema);

@Injectable({ providedIn: 'root' })
export class ClientReportsData {
  private readonly http = inject(HttpClient);
  private readonly notifier = inject(Notifier);

  list(query: ListQuery): Observable<Page<ReportSummary>> {
    return this.http.get('/api/client/reports', { params: queryParams(query) }).pipe(map((r) => ReportPageSchema.parse(r)));
  }

  latest(limit: number): Observable<Page<ReportSummary>> {
    const params = new HttpParams().set('sort', 'issuedAt').set('dir', 'desc').set('page', 1).set('pageSize', limit);
    return this.http.get('/api/client/reports', { params }).pipe(map((r) => ReportPageSchema.parse(r)));
  }

  /** Through HttpClient, since the sign-in token is not a cookie a plain link would carry. */
  download(report: ReportSummary): void {
    this.http.get(`/api/client/reports/${report.id}/pdf`, { responseType: 'blob' }).subscribe((blob) => {
      const url = URL.createObjectURL(blob);
      const a = document.createElement('a');
      a.href = url;
      a.download = `${report.number}.pdf`;
      a.click();
      setTimeout(() => URL.revokeObjectURL(url), 10_000);
      this.notifier.success(`${report.number}.pdf downloaded.`);
    });
  }
}
