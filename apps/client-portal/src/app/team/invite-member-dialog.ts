import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatRadioModule } from '@angular/material/radio';
import type { ClientRole, Invitation } from '@ohmprint/contracts';
import { ApiProblem, Notice, showFieldErrors } from '@ohmprint/ui';
import { TeamData } from './team-data';

@Component({
  selector: 'ohm-invite-member-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatRadioModule, MatProgressBarModule, Notice],
  template: `
    <h2 mat-dialog-title>Invite a colleague</h2>
    <form [formGroup]="form" (ngSubmit)="invite()" novalidate>
      <mat-dialog-content class="ohm-dialog-form">
        <p class="lead">They get an e-mail with a link to choose their name and password. The link works once.</p>
        @if (problem(); as p) {
          <ohm-notice tone="error" icon="error">{{ p.summary }}</ohm-notice>
        }
        <mat-form-field>
          <mat-label>E-mail</mat-label>
          <input matInput type="email" formControlName="email" required cdkFocusInitial />
          @if (form.controls.email.hasError('required')) {
            <mat-error>Enter their e-mail address.</mat-error>
          } @else if (form.controls.email.hasError('email')) {
            <mat-error>That doesn't look like an e-mail address.</mat-error>
          } @else if (form.controls.email.hasError('server')) {
            <mat-error>E-mail {{ form.controls.email.getError('server') }}.</mat-error>
          }
        </mat-form-field>
        <fieldset>
          <legend>What they may do</legend>
          <mat-radio-group formControlName="role" class="roles" aria-label="Role">
            <mat-radio-button value="client-member">
              <span class="choice">Member</span>
              <span class="hint">Sees orders and downloads reports.</span>
            </mat-radio-button>
            <mat-radio-button value="client-admin">
              <span class="choice">Admin</span>
              <span class="hint">Also manages products, orders, credits and the team.</span>
            </mat-radio-button>
          </mat-radio-group>
        </fieldset>
        @if (saving()) {
          <mat-progress-bar mode="indeterminate" aria-label="Sending the invitation" />
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="saving()">Send invitation</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .roles {
      display: flex;
      flex-direction: column;
    }
    .choice {
      display: block;
    }
    .hint {
      display: block;
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
  `,
})
export class InviteMemberDialog {
  private readonly data = inject(TeamData);
  private readonly dialogRef = inject<MatDialogRef<InviteMemberDialog, Invitation>>(MatDialogRef);
  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email]],
    role: ['client-member' as ClientRole, Validators.required],
  });
  protected readonly saving = signal(false);
  protected readonly problem = signal<ApiProblem | null>(null);

  protected invite(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.saving.set(true);
    this.problem.set(null);
    this.data.invite(this.form.getRawValue()).subscribe({
      next: (invitation) => this.dialogRef.close(invitation),
      error: (error: unknown) => {
        const problem = ApiProblem.from(error);
        this.saving.set(false);
        this.problem.set(problem);
        showFieldErrors(this.form, problem);
      },
    });
  }
}
