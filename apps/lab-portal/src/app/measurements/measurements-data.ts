import { HttpClient, HttpEventType, type HttpEvent } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import {
  BenchEquipmentSchema,
  MeasurementUploadResultSchema,
  SampleMeasurementsSchema,
  SpectrumPointsSchema,
  type BenchEquipment,
  type MeasurementUploadFields,
  type MeasurementUploadResult,
  type SampleMeasurements,
  type SpectrumPoints,
} from '@ohmprint/contracts';
import { quietRequest } from '@ohmprint/ui';
import { filter, map, type Observable } from 'rxjs';

/** Progress of one file's upload: a share of bytes sent, then the API's answer. */
export type UploadProgress =
  | { readonly kind: 'progress'; readonly percent: number }
  | { readonly kind: 'done'; readonly result: MeasurementUploadResult };

@Injectable({ providedIn: 'root' })
export class MeasurementsData {
  private readonly http = inject(HttpClient);

  equipment(): Observable<BenchEquipment> {
    return this.http.get('/api/lab/bench').pipe(map((r) => BenchEquipmentSchema.parse(r)));
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
    if (fields.temperatureC !== undefined) form.append('temperatureC', String(fields.temperatureC));
    if (fields.confirmations?.length) form.append('confirmations', JSON.stringify(fields.confirmations));
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

  spectrum(sampleId: string, replicateId: string): Observable<SpectrumPoints> {
    return this.http.get(`/api/lab/samples/${sampleId}/replicates/${replicateId}/spectrum`).pipe(map((r) => SpectrumPointsSchema.parse(r)));
  }

  /** Answers with the sample's measurements as they now stand (agreement recomputed without it). */
  exclude(sampleId: string, replicateId: string, reason: string): Observable<SampleMeasurements> {
    return this.http
      .post(`/api/lab/samples/${sampleId}/replicates/${replicateId}/exclude`, { reason }, { context: quietRequest() })
      .pipe(map((r) => SampleMeasurementsSchema.parse(r)));
  }
}
