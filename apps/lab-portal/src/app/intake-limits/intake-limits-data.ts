import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { IntakeLimitsSchema, type IntakeLimits, type UpdateIntakeLimits } from '@ohmprint/contracts';
import { quietRequest } from '@ohmprint/ui';
import { map, type Observable } from 'rxjs';

@Injectable({ providedIn: 'root' })
export class IntakeLimitsData {
  private readonly http = inject(HttpClient);

  load(): Observable<IntakeLimits> {
    return this.http.get('/api/lab/intake-limits').pipe(map((r) => IntakeLimitsSchema.parse(r)));
  }

  /** Quiet: a refused value is shown on its field. */
  save(body: UpdateIntakeLimits): Observable<IntakeLimits> {
    return this.http.put('/api/lab/intake-limits', body, { context: quietRequest() }).pipe(map((r) => IntakeLimitsSchema.parse(r)));
  }
}
