import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { SigningCredentialState } from '@ohmprint/contracts';
import { ApiProblem, Notice, Notifier } from '@ohmprint/ui';
import { CredentialFacts } from './credential-facts';
import { LabSettingsData } from './lab-settings-data';

/** The certificate the lab's reports are signed with, and replacing it with the lab's own PKCS#12 file. */
@Component({
  selector: 'ohm-signing-certificate-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule, Notice, CredentialFacts],
  template: `
    <header class="ohm-page-header">
      <div>
        <h1>Signing certificate</h1>
        <p>Every report PDF is digitally signed with this certificate, so anyone holding the file can tell it came from the lab unaltered.</p>
      </div>
    </header>
    @if (state(); as s) {
      <section class="card" aria-labelledby="current-heading">
        <h2 id="current-heading">In use now</h2>
        @if (s.credential; as c) {
          <ohm-credential-facts [credential]="c" />
        } @else {
          <ohm-notice tone="info" icon="info">No certificate yet. On a development setup the first report creates a <strong>development self-signed</strong> credential; a production setup refuses to issue reports until one is uploaded here.</ohm-notice>
        }
      </section>
      <section class="card" aria-labelledby="upload-heading">
        <h2 id="upload-heading">Upload the lab's certificate</h2>
        <p class="ohm-muted">A PKCS#12 file (.p12 or .pfx) holding the private key and its certificate, with its passphrase. The file is checked before anything changes: a wrong passphrase, a certificate out of date or a file without a key is refused and the current certificate stays.</p>
        <form (submit)="upload($event)" class="upload" aria-label="Upload a signing certificate">
          <label class="file">
            <span class="label">PKCS#12 file</span>
            <input type="file" accept=".p12,.pfx,application/x-pkcs12" (change)="picked($event)" />
          </label>
          <mat-form-field>
            <mat-label>Passphrase</mat-label>
            <input matInput type="password" autocomplete="off" [formControl]="passphrase" />
          </mat-form-field>
          <button mat-flat-button type="submit" [disabled]="!file() || busy()"><mat-icon>upload_file</mat-icon>Check and use this certificate</button>
        </form>
        @if (busy()) { <mat-progress-bar mode="indeterminate" aria-label="Checking the certificate" /> }
        @if (problem(); as p) { <ohm-notice tone="error" icon="error">{{ p }} The certificate in use has not changed.</ohm-notice> }
      </section>
    } @else {
      <mat-progress-bar mode="indeterminate" aria-label="Loading the signing certificate" />
    }
  `,
  styles: `
    :host { display: block; max-width: 960px; }
    .card { padding: 16px; margin-bottom: 16px; border-radius: var(--mat-sys-corner-medium); background: var(--mat-sys-surface-container-low); }
    .card h2 { font: var(--mat-sys-title-medium); margin: 0 0 12px; }
    .upload { display: flex; flex-wrap: wrap; gap: 16px; align-items: center; }
    .file { display: flex; flex-direction: column; gap: 4px; }
    .file .label { font: var(--mat-sys-label-large); }
    .upload mat-form-field { width: min(320px, 100%); }
  `,
})
export class SigningCertificatePage {
  private readonly data = inject(LabSettingsData);
  private readonly notifier = inject(Notifier);
  protected readonly state = signal<SigningCredentialState | null>(null);
  protected readonly file = signal<File | null>(null);
  protected readonly busy = signal(false);
  protected readonly problem = signal<string | null>(null);
  protected readonly passphrase = new FormControl('', { nonNullable: true, validators: [Validators.maxLength(200)] });

  constructor() {
    this.data.credential().subscribe((s) => this.state.set(s));
  }

  protected picked(event: Event): void {
    this.file.set((event.target as HTMLInputElement).files?.[0] ?? null);
    this.problem.set(null);
  }

  protected upload(event: Event): void {
    event.preventDefault();
    const file = this.file();
    if (!file) return;
    this.busy.set(true);
    this.problem.set(null);
    this.data.uploadCredential(file, this.passphrase.value).subscribe({
      next: (s) => {
        this.busy.set(false);
        this.state.set(s);
        this.passphrase.reset();
        this.notifier.success('Certificate checked and in use: the next report is signed with it.');
      },
      error: (e: unknown) => {
        this.busy.set(false);
        this.problem.set(ApiProblem.from(e).summary);
      },
    });
  }
}
