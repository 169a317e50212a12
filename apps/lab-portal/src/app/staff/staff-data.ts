import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import {
  InvitationSchema,
  StaffMemberSchema,
  pageOf,
  type ChangeStaffRolesRequest,
  type Invitation,
  type InviteStaffRequest,
  type ListQuery,
  type Page,
  type StaffMember,
} from '@ohmprint/contracts';
import { quietRequest, queryParams } from '@ohmprint/ui';
import { map, type Observable } from 'rxjs';

const StaffPageSchema = pageOf(StaffMemberSchema);
const InvitationPageSchema = pageOf(InvitationSchema);

/** The lab's staff, as the lab admin manages them. */
@Injectable({ providedIn: 'root' })
export class StaffData {
  private readonly http = inject(HttpClient);

  list(query: ListQuery): Observable<Page<StaffMember>> {
    return this.http.get('/api/lab/staff', { params: queryParams(query) }).pipe(map((r) => StaffPageSchema.parse(r)));
  }

  /** The newest open invitations (not yet accepted or revoked). */
  pendingInvitations(): Observable<Page<Invitation>> {
    return this.http.get('/api/lab/staff/invitations', { params: { sort: 'createdAt', dir: 'desc', page: 1, pageSize: 10 } }).pipe(map((r) => InvitationPageSchema.parse(r)));
  }

  invite(body: InviteStaffRequest): Observable<Invitation> {
    return this.http.post('/api/lab/staff/invitations', body, { context: quietRequest() }).pipe(map((r) => InvitationSchema.parse(r)));
  }

  changeRoles(id: string, body: ChangeStaffRolesRequest): Observable<StaffMember> {
    return this.http.put(`/api/lab/staff/${id}/roles`, body, { context: quietRequest() }).pipe(map((r) => StaffMemberSchema.parse(r)));
  }

  deactivate(id: string): Observable<StaffMember> {
    return this.http.post(`/api/lab/staff/${id}/deactivation`, {}).pipe(map((r) => StaffMemberSchema.parse(r)));
  }

  reactivate(id: string): Observable<StaffMember> {
    return this.http.post(`/api/lab/staff/${id}/reactivation`, {}).pipe(map((r) => StaffMemberSchema.parse(r)));
  }
}
