import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { SigningCredentialSummary } from '@ohmprint/contracts';

/** The public facts of a signing credential as a definition list, saying plainly when it is the development one. */
@Component({
  selector: 'ohm-credential-facts',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatIconModule],
  template: `
    @let c = credential();
    @if (c.origin === 'development') {
      <p class="dev"><mat-icon aria-hidden="true">warning</mat-icon><strong>Development self-signed credential.</strong> Readers cannot trace it to a certificate authority; upload the lab's own certificate before issuing reports to real clients.</p>
    }
    <dl>
      <dt>Subject</dt><dd>{{ c.subject }}</dd>
      <dt>Issuer</dt><dd>{{ c.issuer }}{{ c.issuer === c.subject ? ' (self-signed)' : '' }}</dd>
      <dt>Valid</dt><dd>{{ c.notBefore | date: 'd MMM y' }} to {{ c.notAfter | date: 'd MMM y' }}</dd>
      @if (!compact()) {
        <dt>Serial number</dt><dd class="mono">{{ c.serialNumber }}</dd>
        <dt>SHA-256 fingerprint</dt><dd class="mono fp">{{ c.fingerprintSha256 }}</dd>
        <dt>In use since</dt><dd>{{ c.createdAt | date: 'd MMM y, HH:mm' }} ({{ c.origin === 'uploaded' ? 'uploaded' : 'created automatically on first issue' }})</dd>
      }
    </dl>
  `,
  styles: `
    dl { display: grid; grid-template-columns: max-content 1fr; gap: 4px 16px; margin: 0; }
    dt { color: var(--mat-sys-on-surface-variant); }
    dd { margin: 0; overflow-wrap: anywhere; }
    .mono { font-family: ui-monospace, monospace; font-size: 0.9em; }
    .dev { display: flex; gap: 8px; align-items: flex-start; padding: 8px 12px; border-radius: var(--mat-sys-corner-small);
      background: var(--mat-sys-tertiary-container); color: var(--mat-sys-on-tertiary-container); margin: 0 0 12px; }
  `,
})
export class CredentialFacts {
  readonly credential = input.required<SigningCredentialSummary>();
  /** Subject, issuer and validity only (the approval confirmation). */
  readonly compact = input(false);
}
