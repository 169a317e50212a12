import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import {
  LabProfileSchema,
  NextIssueSchema,
  SigningCredentialStateSchema,
  type LabProfile,
  type NextIssue,
  type SigningCredentialState,
  type UpdateLabProfileRequest,
} from '@ohmprint/contracts';
import { quietRequest } from '@ohmprint/ui';
import { from, map, switchMap, type Observable } from 'rxjs';

/** The lab admin's settings: the lab's profile and logo, and the report-signing certificate. */
@Injectable({ providedIn: 'root' })
export class LabSettingsData {
  private readonly http = inject(HttpClient);

  profile(): Observable<LabProfile> {
    return this.http.get('/api/lab/profile').pipe(map((r) => LabProfileSchema.parse(r)));
  }

  saveProfile(changes: UpdateLabProfileRequest): Observable<LabProfile> {
    return this.http.patch('/api/lab/profile', changes, { context: quietRequest() }).pipe(map((r) => LabProfileSchema.parse(r)));
  }

  uploadLogo(file: File): Observable<LabProfile> {
    const body = new FormData();
    body.append('logo', file, file.name);
    return this.http.put('/api/lab/profile/logo', body, { context: quietRequest() }).pipe(map((r) => LabProfileSchema.parse(r)));
  }

  removeLogo(): Observable<LabProfile> {
    return this.http.delete('/api/lab/profile/logo').pipe(map((r) => LabProfileSchema.parse(r)));
  }

  /** The logo as a data: URL (the API's content policy allows data: images, and the request carries the token). */
  logoDataUrl(): Observable<string> {
    return this.http.get('/api/lab/profile/logo', { responseType: 'blob', context: quietRequest() }).pipe(
      switchMap(
        (blob) =>
          from(
            new Promise<string>((resolve, reject) => {
              const reader = new FileReader();
              reader.onload = () => resolve(String(reader.result));
              reader.onerror = () => reject(reader.error);
              reader.readAsDataURL(blob);
            }),
          ),
      ),
    );
  }

  credential(): Observable<SigningCredentialState> {
    return this.http.get('/api/lab/signing-credential').pipe(map((r) => SigningCredentialStateSchema.parse(r)));
  }

  uploadCredential(file: File, passphrase: string): Observable<SigningCredentialState> {
    const body = new FormData();
    body.append('passphrase', passphrase);
    body.append('file', file, file.name);
    return this.http.post('/api/lab/signing-credential', body, { context: quietRequest() }).pipe(map((r) => SigningCredentialStateSchema.parse(r)));
  }

  /** The number the next approval would take and the credential that would sign (read-only). */
  nextIssue(): Observable<NextIssue> {
    return this.http.get('/api/lab/report-numbers/next', { context: quietRequest() }).pipe(map((r) => NextIssueSchema.parse(r)));
  }
}
