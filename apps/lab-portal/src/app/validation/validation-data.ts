import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import {
  CorrelationStudySchema,
  DetectionStudySchema,
  OngoingPerformanceSchema,
  RepeatabilityStudySchema,
  type CorrelationStudy,
  type DetectionStudy,
  type OngoingPerformance,
  type RepeatabilityStudy,
} from '@ohmprint/contracts';
import { map, type Observable } from 'rxjs';
import { z } from 'zod';

/** Just what the version picker needs from the library list, read leniently. */
const LibraryChoiceSchema = z.object({
  items: z.array(
    z.object({
      product: z.object({ id: z.uuid(), name: z.string() }),
      clientOrganisation: z.object({ name: z.string() }),
      versions: z.array(z.object({ id: z.uuid(), version: z.number(), status: z.string(), lotCount: z.number() })),
    }),
  ),
});

export interface VersionChoice {
  versionId: string;
  productId: string;
  label: string;
}

@Injectable({ providedIn: 'root' })
export class ValidationData {
  private readonly http = inject(HttpClient);

  /** Published versions, newest first within each product. */
  versions(): Observable<VersionChoice[]> {
    return this.http.get('/api/lab/libraries', { params: { pageSize: 100 } }).pipe(
      map((r) => LibraryChoiceSchema.parse(r).items),
      map((items) =>
        items.flatMap((l) =>
          l.versions
            .filter((v) => v.status === 'published')
            .sort((a, b) => b.version - a.version)
            .map((v) => ({ versionId: v.id, productId: l.product.id, label: `${l.product.name} (${l.clientOrganisation.name}) · version ${v.version} · ${v.lotCount} lots` })),
        ),
      ),
    );
  }

  correlation(versionId: string): Observable<CorrelationStudy> {
    return this.http.get(`/api/lab/validation/library-versions/${versionId}/correlation`).pipe(map((r) => CorrelationStudySchema.parse(r)));
  }

  repeatability(versionId: string): Observable<RepeatabilityStudy> {
    return this.http.get(`/api/lab/validation/library-versions/${versionId}/repeatability`).pipe(map((r) => RepeatabilityStudySchema.parse(r)));
  }

  detection(productId: string): Observable<DetectionStudy> {
    return this.http.get(`/api/lab/validation/products/${productId}/detection`).pipe(map((r) => DetectionStudySchema.parse(r)));
  }

  performance(): Observable<OngoingPerformance> {
    return this.http.get('/api/lab/validation/ongoing-performance').pipe(map((r) => OngoingPerformanceSchema.parse(r)));
  }
}
