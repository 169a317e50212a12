import { Injectable, computed, inject, signal } from '@angular/core';
import { Router } from '@angular/router';
import type { Me, Role, SessionResponse } from '@ohmprint/contracts';
import { catchError, finalize, firstValueFrom, map, of, shareReplay, tap, timeout, type Observable } from 'rxjs';
import { PORTAL } from '../portal/portal-config';
import { AuthApi } from './auth-api';

/** Thrown by signIn when the account belongs to the other portal. */
export class WrongPortalError extends Error {
  constructor(readonly user: Me) {
    super('This account belongs to the other portal');
    this.name = 'WrongPortalError';
  }
}

/**
 * Who is signed in. The access token lives only in memory; a reload restores the session through
 * the refresh cookie. Several requests failing at once share one refresh.
 */
@Injectable({ providedIn: 'root' })
export class Session {
  private readonly api = inject(AuthApi);
  private readonly router = inject(Router);
  private readonly portal = inject(PORTAL);

  private readonly token = signal<string | null>(null);
  private readonly me = signal<Me | null>(null);
  private pendingRefresh: Observable<string> | null = null;

  readonly user = this.me.asReadonly();
  readonly signedIn = computed(() => this.me() !== null);
  readonly roles = computed<readonly Role[]>(() => this.me()?.roles ?? []);
  /** The lab or client organisation shown in the toolbar. */
  readonly organisationName = computed(() => {
    const user = this.me();
    return user?.clientOrganisation?.name ?? user?.lab?.name ?? null;
  });
  /** Set when a restored session belongs to the other portal, so sign-in can explain. */
  readonly otherPortalAccount = signal<Me | null>(null);

  accessToken(): string | null {
    return this.token();
  }

  hasAnyRole(roles: readonly Role[]): boolean {
    return this.roles().some((r) => roles.includes(r));
  }

  fitsThisPortal(user: Me): boolean {
    return user.roles.some((r) => this.portal.acceptedRoles.includes(r));
  }

  signIn(email: string, password: string): Observable<Me> {
    return this.api.signIn({ email, password }).pipe(map((response) => this.adopt(response)));
  }

  /**
   * Takes over a session the API just opened (sign-in, accepted invitation, changed password).
   * Throws WrongPortalError, keeping nothing, when the account belongs to the other portal.
   */
  adopt({ accessToken, user }: SessionResponse): Me {
    if (!this.fitsThisPortal(user)) {
      this.otherPortalAccount.set(user);
      this.forget();
      throw new WrongPortalError(user);
    }
    this.accept(accessToken, user);
    return user;
  }

  /** Called once at start: a valid refresh cookie signs the user back in. Never throws. */
  restore(): Promise<void> {
    return firstValueFrom(
      this.refresh().pipe(
        timeout(8000),
        map(() => undefined),
        catchError(() => of(undefined)),
      ),
    );
  }

  /** A fresh access token; concurrent callers share the one request in flight. */
  refresh(): Observable<string> {
    if (!this.pendingRefresh) {
      this.pendingRefresh = this.api.refresh().pipe(
        map((response) => {
          this.adopt(response);
          return response.accessToken;
        }),
        finalize(() => (this.pendingRefresh = null)),
        shareReplay({ bufferSize: 1, refCount: false }),
      );
    }
    return this.pendingRefresh;
  }

  /** The profile changed (display name): keep the toolbar in step. */
  updateUser(user: Me): void {
    this.me.set(user);
  }

  signOut(): Observable<void> {
    return this.api.signOut().pipe(
      catchError(() => of(null)),
      tap(() => this.forget()),
      map(() => undefined),
      tap(() => void this.router.navigate(['/sign-in'], { queryParams: { signedOut: 1 } })),
    );
  }

  /** The refresh failed: the session is over; send the user to sign in and come back here. */
  expire(): void {
    const returnUrl = this.router.url;
    this.forget();
    void this.router.navigate(['/sign-in'], { queryParams: { expired: 1, returnUrl } });
  }

  private accept(token: string, user: Me): void {
    this.otherPortalAccount.set(null);
    this.token.set(token);
    this.me.set(user);
  }

  private forget(): void {
    this.token.set(null);
    this.me.set(null);
  }
}
