import { HttpClient, HttpEventType, type HttpEvent } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import {
  BenchEquipmentSchema,
  MeasurementUploadResultSchema,
  ReplicateSchema,
  SampleMeasurementsSchema,
  SpectrumPointsSchema,
  type BenchEquipment,
  type MeasurementUploadFields,
  type MeasurementUploadResult,
  type Replicate,
  type SampleMeasurements,
  type SpectrumPoints,
} from '@ohmprint/contracts';
import { quietRequest } from '@ohmprint/ui';
import { filter, map, type Observable } from 'rxjs';
import { z } from 'zod';

/** Kramers–Kronig residuals of one replicate in % of |Z|, for the residual plot. */
export const KkResidualPointsSchema = z.object({
  frequencyHz: z.array(z.number()),
  rePercent: z.array(z.number()),
  imPercent: z.array(z.number()),
  limitPercent: z.number(),
});
export type KkResidualPoints = z.infer<typeof KkResidualPointsSchema>;

/** Progress of one file's upload: a share of bytes sent, then the API's answer. */
export type UploadProgress =
  | { readonly kind: 'progress'; readonly percent: number }
  | { readonly kind: 'done'; readonly result: MeasurementUploadResult };

@Injectable({ providedIn: 'root' })
export class MeasurementsData {
  private readonly http = inject(HttpClient);

  equipment(): Observable<BenchEquipment> {
    return this.http.get('/api/lab/bench-equipment').pipe(map((r) => BenchEquipmentSchema.parse(r)));
  }

  forSample(sampleId: string): Observable<SampleMeasurements> {
    return this.http.get(`/api/lab/samples/${sampleId}/measurements`).pipe(map((r) => SampleMeasurementsSchema.parse(r)));
  }

  /**
   * One file per request, so each file has its own progress bar and its own answer: a file the
   * parser refuses never takes the others down with it.
   */
  upload(sampleId: string, fields: MeasurementUploadFields, file: File): Observable<UploadProgress> {
    const form = new FormData();
    form.append('instrumentId', fields.instrumentId);
    form.append('cellId', fields.cellId);
    form.append('cellConstantSource', fields.cellConstantSource);
    if (fields.cellConstantPerCm !== undefined) form.append('cellConstantPerCm', String(fields.cellConstantPerCm));
    form.append('temperatureC', String(fields.temperatureC));
    form.append('files', file, file.name);
    return this.http
      .post(`/api/lab/samples/${sampleId}/measurements`, form, { reportProgress: true, observe: 'events', context: quietRequest() })
      .pipe(
        filter((e: HttpEvent<unknown>) => e.type === HttpEventType.UploadProgress || e.type === HttpEventType.Response),
        map((e): UploadProgress => {
          if (e.type === HttpEventType.UploadProgress) {
            return { kind: 'progress', percent: e.total ? Math.round((100 * e.loaded) / e.total) : 0 };
          }
          return { kind: 'done', result: MeasurementUploadResultSchema.parse((e as { body: unknown }).body) };
        }),
      );
  }

  spectrum(replicateId: string): Observable<SpectrumPoints> {
    return this.http.get(`/api/lab/replicates/${replicateId}/spectrum`).pipe(map((r) => SpectrumPointsSchema.parse(r)));
  }

  kkResiduals(replicateId: string): Observable<KkResidualPoints> {
    return this.http
      .get(`/api/lab/replicates/${replicateId}/kramers-kronig`, { context: quietRequest() })
      .pipe(map((r) => KkResidualPointsSchema.parse(r)));
  }

  exclude(replicateId: string, reason: string): Observable<Replicate> {
    return this.http
      .post(`/api/lab/replicates/${replicateId}/exclude`, { reason }, { context: quietRequest() })
      .pipe(map((r) => ReplicateSchema.parse(r)));
  }
}
