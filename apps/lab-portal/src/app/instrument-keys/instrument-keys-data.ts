import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { InstrumentKeySchema, IssuedInstrumentKeySchema, type InstrumentKey, type IssuedInstrumentKey } from '@ohmprint/contracts';
import { quietRequest } from '@ohmprint/ui';
import { map, type Observable } from 'rxjs';
import { z } from 'zod';

const KeyListSchema = z.array(InstrumentKeySchema);

/** API keys that let a bench computer post measurements without a person signing in. */
@Injectable({ providedIn: 'root' })
export class InstrumentKeysData {
  private readonly http = inject(HttpClient);

  list(): Observable<InstrumentKey[]> {
    return this.http.get('/api/lab/instrument-keys').pipe(map((r) => KeyListSchema.parse(r)));
  }

  issue(name: string): Observable<IssuedInstrumentKey> {
    return this.http.post('/api/lab/instrument-keys', { name }, { context: quietRequest() }).pipe(map((r) => IssuedInstrumentKeySchema.parse(r)));
  }

  revoke(id: string): Observable<InstrumentKey> {
    return this.http.post(`/api/lab/instrument-keys/${id}/revoke`, {}).pipe(map((r) => InstrumentKeySchema.parse(r)));
  }
}
