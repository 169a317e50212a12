import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import {
  CustodyEventSchema,
  CustodyTimelineSchema,
  IntakePhotoSchema,
  SampleDetailSchema,
  type AcceptSample,
  type CustodyEvent,
  type CustodyTimeline,
  type IntakePhoto,
  type RecordArrival,
  type RecordCustodyEvent,
  type RejectSample,
  type SampleDetail,
} from '@ohmprint/contracts';
import { quietRequest } from '@ohmprint/ui';
import { map, type Observable } from 'rxjs';
import { z } from 'zod';

const PhotoListSchema = z.array(IntakePhotoSchema);

/** Intake at the bench: find a sample by its code, record the parcel, decide, keep custody. */
@Injectable({ providedIn: 'root' })
export class IntakeData {
  private readonly http = inject(HttpClient);

  /** Quiet: an unknown code is answered inline next to the code field. */
  findByCode(code: string): Observable<SampleDetail> {
    return this.http
      .get(`/api/lab/samples/by-code/${encodeURIComponent(code)}`, { context: quietRequest() })
      .pipe(map((r) => SampleDetailSchema.parse(r)));
  }

  sample(id: string): Observable<SampleDetail> {
    return this.http.get(`/api/lab/samples/${id}`).pipe(map((r) => SampleDetailSchema.parse(r)));
  }

  recordArrival(id: string, body: RecordArrival): Observable<SampleDetail> {
    return this.http.post(`/api/lab/samples/${id}/arrival`, body, { context: quietRequest() }).pipe(map((r) => SampleDetailSchema.parse(r)));
  }

  uploadPhotos(id: string, files: readonly File[]): Observable<IntakePhoto[]> {
    const form = new FormData();
    for (const f of files) form.append('photos', f, f.name);
    return this.http.post(`/api/lab/samples/${id}/photos`, form).pipe(map((r) => PhotoListSchema.parse(r)));
  }

  accept(id: string, body: AcceptSample): Observable<SampleDetail> {
    return this.http.post(`/api/lab/samples/${id}/accept`, body, { context: quietRequest() }).pipe(map((r) => SampleDetailSchema.parse(r)));
  }

  reject(id: string, body: RejectSample): Observable<SampleDetail> {
    return this.http.post(`/api/lab/samples/${id}/reject`, body, { context: quietRequest() }).pipe(map((r) => SampleDetailSchema.parse(r)));
  }

  custody(id: string): Observable<CustodyTimeline> {
    return this.http.get(`/api/lab/samples/${id}/custody`).pipe(map((r) => CustodyTimelineSchema.parse(r)));
  }

  recordCustody(id: string, body: RecordCustodyEvent): Observable<CustodyEvent> {
    return this.http.post(`/api/lab/samples/${id}/custody`, body, { context: quietRequest() }).pipe(map((r) => CustodyEventSchema.parse(r)));
  }

  /** Photos are fetched with the token (not a bare <img src>) because the API needs sign-in. */
  photo(sampleId: string, photoId: string): Observable<Blob> {
    return this.http.get(`/api/lab/samples/${sampleId}/photos/${photoId}`, { responseType: 'blob' });
  }
}
