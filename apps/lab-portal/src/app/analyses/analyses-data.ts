import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import {
  AnalysisPageSchema,
  AnalysisRunSchema,
  AnalysisSchema,
  ApprovalResultSchema,
  LibraryPageSchema,
  LotDistancePageSchema,
  ReferenceBandViewSchema,
  type Analysis,
  type AnalysisRun,
  type AnalysisPage,
  type ApprovalResult,
  type LibraryItem,
  type ListQuery,
  type LotDistancePage,
  type ReferenceBandView,
} from '@ohmprint/contracts';
import { queryParams, quietRequest } from '@ohmprint/ui';
import { map, type Observable } from 'rxjs';

/** Analyses of a sample against a published library version, and their review. */
@Injectable({ providedIn: 'root' })
export class AnalysesData {
  private readonly http = inject(HttpClient);

  /** The product's library with its versions (only published ones can be analysed against). */
  libraryFor(productId: string, productName: string): Observable<LibraryItem | null> {
    const params = new HttpParams().set('q', productName).set('pageSize', 100);
    return this.http.get('/api/lab/libraries', { params }).pipe(
      map((r) => LibraryPageSchema.parse(r).items.find((l) => l.product.id === productId) ?? null),
    );
  }

  /** A published version's reference band, stored when it was published (a few kilobytes whatever the lot count). Quiet: without it the plots show the sample alone. */
  referenceBand(libraryVersionId: string): Observable<ReferenceBandView> {
    return this.http.get(`/api/lab/library-versions/${libraryVersionId}/reference-band`, { context: quietRequest() }).pipe(map((r) => ReferenceBandViewSchema.parse(r)));
  }

  /** One page of every lot's distance to the sample, nearest first; `after` is the last rank already shown. */
  lotDistances(analysisId: string, after: number, limit: number): Observable<LotDistancePage> {
    const params = new HttpParams().set('after', after).set('limit', limit);
    return this.http.get(`/api/lab/analyses/${analysisId}/lot-distances`, { params }).pipe(map((r) => LotDistancePageSchema.parse(r)));
  }

  forSample(sampleId: string): Observable<AnalysisPage> {
    const params = new HttpParams().set('sampleId', sampleId).set('sort', 'createdAt').set('dir', 'desc').set('pageSize', 20);
    return this.http.get('/api/lab/analyses', { params }).pipe(map((r) => AnalysisPageSchema.parse(r)));
  }

  /** Analyses waiting for a reviewer, oldest submission first. */
  awaitingReview(query: ListQuery): Observable<AnalysisPage> {
    return this.http
      .get('/api/lab/analyses', { params: queryParams(query).set('status', 'submitted') })
      .pipe(map((r) => AnalysisPageSchema.parse(r)));
  }

  get(id: string): Observable<Analysis> {
    return this.http.get(`/api/lab/analyses/${id}`).pipe(map((r) => AnalysisSchema.parse(r)));
  }

  /** Runs an analysis: at once (the analysis), or against a large library on a worker (202 and where it is; follow it with `analysisRun`). */
  run(sampleId: string, libraryVersionId: string): Observable<{ analysis: Analysis } | { run: AnalysisRun }> {
    return this.http
      .post(`/api/lab/samples/${sampleId}/analyses`, { libraryVersionId }, { context: quietRequest(), observe: 'response' })
      .pipe(map((r) => (r.status === 202 ? { run: AnalysisRunSchema.parse(r.body) } : { analysis: AnalysisSchema.parse(r.body) })));
  }

  analysisRun(sampleId: string): Observable<AnalysisRun> {
    return this.http.get(`/api/lab/samples/${sampleId}/analysis-run`, { context: quietRequest() }).pipe(map((r) => AnalysisRunSchema.parse(r)));
  }

  saveRemarks(id: string, remarks: string): Observable<Analysis> {
    return this.http.put(`/api/lab/analyses/${id}/remarks`, { remarks }).pipe(map((r) => AnalysisSchema.parse(r)));
  }

  submit(id: string): Observable<Analysis> {
    return this.http.post(`/api/lab/analyses/${id}/submit`, {}, { context: quietRequest() }).pipe(map((r) => AnalysisSchema.parse(r)));
  }

  /** Quiet: the four-eyes refusal is explained on the review page itself. */
  approve(id: string, comments: string): Observable<ApprovalResult> {
    return this.http
      .post(`/api/lab/analyses/${id}/approve`, { comments }, { context: quietRequest() })
      .pipe(map((r) => ApprovalResultSchema.parse(r)));
  }

  /** Where the approved analysis's report is (issuing, issued or failed); the review page polls it. */
  issuance(id: string): Observable<ApprovalResult> {
    return this.http.get(`/api/lab/analyses/${id}/issuance`, { context: quietRequest() }).pipe(map((r) => ApprovalResultSchema.parse(r)));
  }

  /** Queues a failed issuance again. */
  retryIssuance(id: string): Observable<ApprovalResult> {
    return this.http.post(`/api/lab/analyses/${id}/issuance/retry`, {}, { context: quietRequest() }).pipe(map((r) => ApprovalResultSchema.parse(r)));
  }

  returnToAnalyst(id: string, comments: string): Observable<Analysis> {
    return this.http
      .post(`/api/lab/analyses/${id}/return`, { comments }, { context: quietRequest() })
      .pipe(map((r) => AnalysisSchema.parse(r)));
  }
}
