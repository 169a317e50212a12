import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { WorkQueuePageSchema, type ListQuery, type SampleState, type WorkQueuePage } from '@ohmprint/contracts';
import { queryParams } from '@ohmprint/ui';
import { map, type Observable } from 'rxjs';

/** The lab's work queue: samples that need someone, oldest first by default. */
@Injectable({ providedIn: 'root' })
export class QueueData {
  private readonly http = inject(HttpClient);

  list(query: ListQuery, states: readonly SampleState[]): Observable<WorkQueuePage> {
    let params = queryParams(query);
    if (states.length > 0) params = params.set('state', states.join(','));
    return this.http.get('/api/lab/samples', { params }).pipe(map((r) => WorkQueuePageSchema.parse(r)));
  }
}
