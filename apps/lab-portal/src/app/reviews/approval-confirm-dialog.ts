import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { NextIssue } from '@ohmprint/contracts';
import { ApiProblem, Notice } from '@ohmprint/ui';
import { CredentialFacts } from '../lab-settings/credential-facts';
import { LabSettingsData } from '../lab-settings/lab-settings-data';

export interface ApprovalConfirmData {
  readonly sampleCode: string;
}

/**
 * Before a report is issued: which number it will take and which credential will sign it. Issuing
 * cannot be undone (only amended or revoked), so the reviewer confirms knowing both.
 */
@Component({
  selector: 'ohm-approval-confirm-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatDialogModule, MatButtonModule, MatIconModule, MatProgressBarModule, Notice, CredentialFacts],
  template: `
    <h2 mat-dialog-title>Issue the report for {{ d.sampleCode }}?</h2>
    <mat-dialog-content>
      @if (next(); as n) {
        <p>Approving issues a signed report and e-mails the client. It cannot be withdrawn, only amended or revoked.</p>
        <h3>Report number</h3>
        <p class="number"><strong>{{ n.nextReportNumber }}</strong></p>
        <p class="ohm-muted">The number is taken only when you approve; if a colleague issues a report first, this one gets the next.</p>
        <h3>Signed with</h3>
        @if (n.credential; as c) {
          <ohm-credential-facts [credential]="c" [compact]="true" />
        } @else if (n.withoutCredential === 'development-self-signed') {
          <ohm-notice tone="info" icon="warning">No certificate has been uploaded: a <strong>development self-signed</strong> credential will be created for this lab and sign the report. Upload the lab's own certificate (Signing certificate page) before issuing reports to real clients.</ohm-notice>
        } @else {
          <ohm-notice tone="error" icon="block">No signing certificate: a lab admin must upload one before reports can be issued.</ohm-notice>
        }
      } @else if (problem(); as p) {
        <ohm-notice tone="error" icon="error">What would be issued could not be loaded: {{ p }}</ohm-notice>
      } @else {
        <mat-progress-bar mode="indeterminate" aria-label="Loading the report number and signing certificate" />
      }
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" [mat-dialog-close]="false">Cancel</button>
      <button mat-flat-button type="button" [mat-dialog-close]="true" [disabled]="!next() || next()?.withoutCredential === 'refused'">
        <mat-icon>verified</mat-icon>Approve and issue
      </button>
    </mat-dialog-actions>
  `,
  styles: `
    h3 { font: var(--mat-sys-title-small); margin: 16px 0 4px; }
    .number { font: var(--mat-sys-title-large); font-family: ui-monospace, monospace; margin: 0; }
    p { max-width: 60ch; }
  `,
})
export class ApprovalConfirmDialog {
  protected readonly d = inject<ApprovalConfirmData>(MAT_DIALOG_DATA);
  protected readonly next = signal<NextIssue | null>(null);
  protected readonly problem = signal<string | null>(null);

  constructor() {
    inject(LabSettingsData)
      .nextIssue()
      .subscribe({ next: (n) => this.next.set(n), error: (e: unknown) => this.problem.set(ApiProblem.from(e).summary) });
  }
}
