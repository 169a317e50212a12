import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import {
  InvitationSchema,
  LabSummarySchema,
  pageOf,
  type ChangeLabStatusRequest,
  type CreateLabRequest,
  type LabSummary,
  type ListQuery,
  type Page,
} from '@ohmprint/contracts';
import { quietRequest, queryParams } from '@ohmprint/ui';
import { map, type Observable } from 'rxjs';
import { z } from 'zod';

const LabPageSchema = pageOf(LabSummarySchema);
const LabCreatedSchema = z.object({ lab: LabSummarySchema, invitation: InvitationSchema });
export type LabCreated = z.infer<typeof LabCreatedSchema>;

/** Lab tenants, as the platform operator manages them. */
@Injectable({ providedIn: 'root' })
export class LabsData {
  private readonly http = inject(HttpClient);

  list(query: ListQuery): Observable<Page<LabSummary>> {
    return this.http.get('/api/operator/labs', { params: queryParams(query) }).pipe(map((r) => LabPageSchema.parse(r)));
  }

  /** Creates the tenant and e-mails its first admin an invitation. */
  create(body: CreateLabRequest): Observable<LabCreated> {
    return this.http.post('/api/operator/labs', body, { context: quietRequest() }).pipe(map((r) => LabCreatedSchema.parse(r)));
  }

  /** Suspend or reactivate; suspension signs all the lab's users out. */
  changeStatus(id: string, body: ChangeLabStatusRequest): Observable<LabSummary> {
    return this.http.patch(`/api/operator/labs/${id}`, body, { context: quietRequest() }).pipe(map((r) => LabSummarySchema.parse(r)));
  }
}
