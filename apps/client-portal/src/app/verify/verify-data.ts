import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { VerificationResultSchema, type VerificationResult } from '@ohmprint/contracts';
import { authEndpoint } from '@ohmprint/ui';
import { map, type Observable } from 'rxjs';

/** The public checks: no token is sent, and errors are shown on the page itself. */
@Injectable({ providedIn: 'root' })
export class VerifyData {
  private readonly http = inject(HttpClient);

  byCode(report: string, code: string): Observable<VerificationResult> {
    const params = new HttpParams().set('report', report).set('code', code);
    return this.http.get('/api/public/verify', { params, context: authEndpoint() }).pipe(map((r) => VerificationResultSchema.parse(r)));
  }

  byFile(file: File, report?: string, code?: string): Observable<VerificationResult> {
    const form = new FormData();
    form.append('file', file, file.name);
    if (report) form.append('report', report);
    if (code) form.append('code', code);
    return this.http.post('/api/public/verify/upload', form, { context: authEndpoint() }).pipe(map((r) => VerificationResultSchema.parse(r)));
  }
}
