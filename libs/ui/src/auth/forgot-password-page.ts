import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { ApiProblem } from '../errors/api-problem';
import { showFieldErrors } from '../errors/form-problems';
import { Notice } from '../feedback/notice';
import { AuthApi } from './auth-api';
import { AuthFrame } from './auth-frame';

@Component({
  selector: 'ohm-forgot-password-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, RouterLink, MatFormFieldModule, MatInputModule, MatButtonModule, MatProgressBarModule, AuthFrame, Notice],
  template: `
    <ohm-auth-frame heading="Reset your password" lead="We'll e-mail you a link to choose a new password. The link works once and expires after a while.">
      @if (sentTo(); as email) {
        <ohm-notice tone="success" icon="mark_email_read">
          If an account exists for {{ email }}, a reset link is on its way. Check your inbox (and spam folder), then follow the link.
        </ohm-notice>
        <a mat-stroked-button routerLink="/sign-in">Back to sign in</a>
      } @else {
        @if (problem(); as p) {
          <ohm-notice tone="error" icon="error">{{ p.summary }}</ohm-notice>
        }
        <form [formGroup]="form" (ngSubmit)="send()" novalidate class="auth-form">
          <mat-form-field>
            <mat-label>E-mail</mat-label>
            <input matInput type="email" formControlName="email" autocomplete="username" required />
            @if (form.controls.email.hasError('required')) {
              <mat-error>Enter the e-mail address you sign in with.</mat-error>
            } @else if (form.controls.email.hasError('email')) {
              <mat-error>That doesn't look like an e-mail address.</mat-error>
            } @else if (form.controls.email.hasError('server')) {
              <mat-error>E-mail {{ form.controls.email.getError('server') }}.</mat-error>
            }
          </mat-form-field>
          @if (saving()) {
            <mat-progress-bar mode="indeterminate" aria-label="Sending" />
          }
          <button mat-flat-button type="submit" [disabled]="saving()">Send reset link</button>
          <a class="secondary-link" routerLink="/sign-in">Back to sign in</a>
        </form>
      }
    </ohm-auth-frame>
  `,
  styleUrl: './auth-forms.scss',
})
export class ForgotPasswordPage {
  private readonly api = inject(AuthApi);
  protected readonly form = inject(NonNullableFormBuilder).group({ email: ['', [Validators.required, Validators.email]] });
  protected readonly saving = signal(false);
  protected readonly sentTo = signal<string | null>(null);
  protected readonly problem = signal<ApiProblem | null>(null);

  protected send(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { email } = this.form.getRawValue();
    this.saving.set(true);
    this.problem.set(null);
    this.api.requestPasswordReset(email).subscribe({
      next: () => {
        this.saving.set(false);
        this.sentTo.set(email);
      },
      error: (error: unknown) => {
        const problem = ApiProblem.from(error);
        this.saving.set(false);
        this.problem.set(problem);
        showFieldErrors(this.form, problem);
      },
    });
  }
}
