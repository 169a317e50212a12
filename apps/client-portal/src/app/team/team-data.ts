import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import {
  ClientTeamMemberSchema,
  InvitationSchema,
  pageOf,
  type ClientTeamMember,
  type Invitation,
  type InviteClientMemberRequest,
  type ListQuery,
  type Page,
} from '@ohmprint/contracts';
import { quietRequest, queryParams } from '@ohmprint/ui';
import { map, type Observable } from 'rxjs';

const TeamPageSchema = pageOf(ClientTeamMemberSchema);
const InvitationPageSchema = pageOf(InvitationSchema);

/** The signed-in user's own organisation's team. */
@Injectable({ providedIn: 'root' })
export class TeamData {
  private readonly http = inject(HttpClient);

  list(query: ListQuery): Observable<Page<ClientTeamMember>> {
    return this.http.get('/api/client/team', { params: queryParams(query) }).pipe(map((r) => TeamPageSchema.parse(r)));
  }

  /** The newest open invitations to this organisation (client admins only). */
  pendingInvitations(): Observable<Page<Invitation>> {
    return this.http.get('/api/client/team/invitations', { params: { sort: 'createdAt', dir: 'desc', page: 1, pageSize: 10 } }).pipe(map((r) => InvitationPageSchema.parse(r)));
  }

  invite(body: InviteClientMemberRequest): Observable<Invitation> {
    return this.http.post('/api/client/team/invitations', body, { context: quietRequest() }).pipe(map((r) => InvitationSchema.parse(r)));
  }

  remove(id: string): Observable<unknown> {
    return this.http.delete(`/api/client/team/${id}`);
  }
}
