import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import {
  InvitationPreviewSchema,
  MeSchema,
  SessionResponseSchema,
  type AcceptInvitationRequest,
  type ChangePasswordRequest,
  type InvitationPreview,
  type Me,
  type PasswordReset,
  type SessionResponse,
  type SignInRequest,
  type UpdateMeRequest,
} from '@ohmprint/contracts';
import { map, type Observable } from 'rxjs';
import { authEndpoint, quietRequest } from '../errors/request-context';

/** The API's account endpoints. Responses are checked against the shared schemas. */
@Injectable({ providedIn: 'root' })
export class AuthApi {
  private readonly http = inject(HttpClient);

  signIn(body: SignInRequest): Observable<SessionResponse> {
    return this.http
      .post('/api/auth/sign-in', body, { context: authEndpoint(), withCredentials: true })
      .pipe(map((r) => SessionResponseSchema.parse(r)));
  }

  refresh(): Observable<SessionResponse> {
    return this.http
      .post('/api/auth/refresh', {}, { context: authEndpoint(), withCredentials: true })
      .pipe(map((r) => SessionResponseSchema.parse(r)));
  }

  signOut(): Observable<unknown> {
    return this.http.post('/api/auth/sign-out', {}, { context: authEndpoint(), withCredentials: true });
  }

  requestPasswordReset(email: string): Observable<unknown> {
    return this.http.post('/api/auth/password-reset-requests', { email }, { context: authEndpoint() });
  }

  resetPassword(body: PasswordReset): Observable<unknown> {
    return this.http.post('/api/auth/password-resets', body, { context: authEndpoint() });
  }

  previewInvitation(token: string): Observable<InvitationPreview> {
    return this.http
      .post('/api/invitations/preview', { token }, { context: authEndpoint() })
      .pipe(map((r) => InvitationPreviewSchema.parse(r)));
  }

  /** Accepting signs the new user in (and sets the refresh cookie). */
  acceptInvitation(body: AcceptInvitationRequest): Observable<SessionResponse> {
    return this.http
      .post('/api/invitations/accept', body, { context: authEndpoint(), withCredentials: true })
      .pipe(map((r) => SessionResponseSchema.parse(r)));
  }

  me(): Observable<Me> {
    return this.http.get('/api/me').pipe(map((r) => MeSchema.parse(r)));
  }

  updateMe(body: UpdateMeRequest): Observable<Me> {
    return this.http.patch('/api/me', body, { context: quietRequest() }).pipe(map((r) => MeSchema.parse(r)));
  }

  /** Every other sign-in ends; this one continues with the fresh session returned. */
  changePassword(body: ChangePasswordRequest): Observable<SessionResponse> {
    return this.http
      .post('/api/me/password', body, { context: quietRequest(), withCredentials: true })
      .pipe(map((r) => SessionResponseSchema.parse(r)));
  }
}
