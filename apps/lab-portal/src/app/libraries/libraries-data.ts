import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import {
  CrossProductCheckSchema,
  LibraryDraftCreatedSchema,
  LibraryLotPageSchema,
  LibraryOverviewSchema,
  LibraryProductPageSchema,
  LibraryPublicationSchema,
  LibraryVersionDetailSchema,
  MethodPageSchema,
  MethodVersionDetailSchema,
  ModelCatalogSchema,
  ModelPreviewSchema,
  PreviewReplicateListSchema,
  type CreateMethod,
  type CrossProductCheck,
  type LibraryDraftCreated,
  type LibraryLotPage,
  type LibraryOverview,
  type LibraryPublication,
  type LibraryVersionDetail,
  type MethodSettings,
  type MethodVersionDetail,
  type ModelCatalog,
  type ModelPreview,
  type PreviewReplicate,
} from '@ohmprint/contracts';
import { quietRequest } from '@ohmprint/ui';
import { map, type Observable } from 'rxjs';
import type { z } from 'zod';

export type LibraryProductPage = z.infer<typeof LibraryProductPageSchema>;
export type MethodPage = z.infer<typeof MethodPageSchema>;

/** Methods and reference libraries: reads parsed by the shared schemas, writes as Observables. */
@Injectable({ providedIn: 'root' })
export class LibrariesData {
  private readonly http = inject(HttpClient);

  methods(q = ''): Observable<MethodPage> {
    return this.http.get('/api/lab/methods', { params: new HttpParams({ fromObject: { pageSize: 100, ...(q ? { q } : {}) } }) }).pipe(map((r) => MethodPageSchema.parse(r)));
  }

  methodVersion(id: string): Observable<MethodVersionDetail> {
    return this.http.get(`/api/lab/method-versions/${id}`).pipe(map((r) => MethodVersionDetailSchema.parse(r)));
  }

  createMethod(body: CreateMethod): Observable<MethodVersionDetail> {
    return this.http.post('/api/lab/methods', body, { context: quietRequest() }).pipe(map((r) => MethodVersionDetailSchema.parse(r)));
  }

  addVersion(methodId: string, settings: MethodSettings, note: string): Observable<MethodVersionDetail> {
    return this.http.post(`/api/lab/methods/${methodId}/versions`, { settings, note }, { context: quietRequest() }).pipe(map((r) => MethodVersionDetailSchema.parse(r)));
  }

  catalog(): Observable<ModelCatalog> {
    return this.http.get('/api/lab/methods/model-catalog').pipe(map((r) => ModelCatalogSchema.parse(r)));
  }

  previewReplicates(): Observable<PreviewReplicate[]> {
    return this.http.get('/api/lab/methods/preview-replicates').pipe(map((r) => PreviewReplicateListSchema.parse(r)));
  }

  preview(replicateId: string, settings: MethodSettings): Observable<ModelPreview> {
    return this.http.post('/api/lab/methods/model-preview', { replicateId, settings }, { context: quietRequest() }).pipe(map((r) => ModelPreviewSchema.parse(r)));
  }

  products(page: number, pageSize: number, q = ''): Observable<LibraryProductPage> {
    return this.http
      .get('/api/lab/library-products', { params: new HttpParams({ fromObject: { page, pageSize, ...(q ? { q } : {}) } }) })
      .pipe(map((r) => LibraryProductPageSchema.parse(r)));
  }

  startDraft(productId: string, methodVersionId: string): Observable<LibraryDraftCreated> {
    return this.http.post('/api/lab/library-drafts', { productId, methodVersionId }).pipe(map((r) => LibraryDraftCreatedSchema.parse(r)));
  }

  version(id: string): Observable<LibraryVersionDetail> {
    return this.http.get(`/api/lab/library-versions/${id}`).pipe(map((r) => LibraryVersionDetailSchema.parse(r)));
  }

  lots(id: string, query: { page: number; pageSize: number; sort: string; dir: string; included: string }): Observable<LibraryLotPage> {
    return this.http.get(`/api/lab/library-versions/${id}/lots`, { params: new HttpParams({ fromObject: query }) }).pipe(map((r) => LibraryLotPageSchema.parse(r)));
  }

  overview(id: string): Observable<LibraryOverview> {
    return this.http.get(`/api/lab/library-versions/${id}/overview`).pipe(map((r) => LibraryOverviewSchema.parse(r)));
  }

  crossProduct(id: string): Observable<CrossProductCheck> {
    return this.http.get(`/api/lab/library-versions/${id}/cross-product`).pipe(map((r) => CrossProductCheckSchema.parse(r)));
  }

  setInclusion(id: string, lotId: string, included: boolean, reason: string): Observable<LibraryVersionDetail> {
    return this.http.put(`/api/lab/library-versions/${id}/lots/${lotId}/inclusion`, { included, reason }).pipe(map((r) => LibraryVersionDetailSchema.parse(r)));
  }

  act(id: string, action: 'calibrate' | 'publish' | 'retire', body: object = {}): Observable<LibraryVersionDetail> {
    return this.http.post(`/api/lab/library-versions/${id}/${action}`, body).pipe(map((r) => LibraryVersionDetailSchema.parse(r)));
  }

  /**
   * Publishes a draft: a small one at once (its detail), a large one by a worker (202 and where its
   * publication is; follow it with `publication`).
   */
  publish(id: string): Observable<{ detail: LibraryVersionDetail } | { publication: LibraryPublication }> {
    return this.http
      .post(`/api/lab/library-versions/${id}/publish`, {}, { observe: 'response' })
      .pipe(map((r) => (r.status === 202 ? { publication: LibraryPublicationSchema.parse(r.body) } : { detail: LibraryVersionDetailSchema.parse(r.body) })));
  }

  publication(id: string): Observable<LibraryPublication> {
    return this.http.get(`/api/lab/library-versions/${id}/publication`, { context: quietRequest() }).pipe(map((r) => LibraryPublicationSchema.parse(r)));
  }

  discard(id: string): Observable<unknown> {
    return this.http.delete(`/api/lab/library-versions/${id}`);
  }
}
