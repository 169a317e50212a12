import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import {
  ClientOrganisationSchema,
  pageOf,
  type ClientOrganisation,
  type CreateClientOrganisationRequest,
  type ListQuery,
  type Page,
} from '@ohmprint/contracts';
import { quietRequest, queryParams } from '@ohmprint/ui';
import { map, type Observable } from 'rxjs';

const OrganisationPageSchema = pageOf(ClientOrganisationSchema);

/** The producers this lab serves. */
@Injectable({ providedIn: 'root' })
export class ClientOrganisationsData {
  private readonly http = inject(HttpClient);

  list(query: ListQuery): Observable<Page<ClientOrganisation>> {
    return this.http.get('/api/lab/client-organisations', { params: queryParams(query) }).pipe(map((r) => OrganisationPageSchema.parse(r)));
  }

  create(body: CreateClientOrganisationRequest): Observable<ClientOrganisation> {
    return this.http
      .post('/api/lab/client-organisations', body, { context: quietRequest() })
      .pipe(map((r) => ClientOrganisationSchema.parse(r)));
  }
}
