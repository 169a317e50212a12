import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import {
  ClientOrganisationSchema,
  InvitationSchema,
  pageOf,
  type ClientOrganisation,
  type CreateClientOrganisationRequest,
  type ListQuery,
  type Page,
} from '@ohmprint/contracts';
import { quietRequest, queryParams } from '@ohmprint/ui';
import { map, type Observable } from 'rxjs';
import { z } from 'zod';

const OrganisationPageSchema = pageOf(ClientOrganisationSchema);
const OrganisationCreatedSchema = z.object({ organisation: ClientOrganisationSchema, invitation: InvitationSchema });
export type OrganisationCreated = z.infer<typeof OrganisationCreatedSchema>;

/** The producers this lab serves. */
@Injectable({ providedIn: 'root' })
export class ClientOrganisationsData {
  private readonly http = inject(HttpClient);

  list(query: ListQuery): Observable<Page<ClientOrganisation>> {
    return this.http.get('/api/lab/client-organisations', { params: queryParams(query) }).pipe(map((r) => OrganisationPageSchema.parse(r)));
  }

  /** Adds the organisation and e-mails its first admin an invitation. */
  create(body: CreateClientOrganisationRequest): Observable<OrganisationCreated> {
    return this.http
      .post('/api/lab/client-organisations', body, { context: quietRequest() })
      .pipe(map((r) => OrganisationCreatedSchema.parse(r)));
  }
}
