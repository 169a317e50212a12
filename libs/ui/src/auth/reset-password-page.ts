import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { ApiProblem } from '../errors/api-problem';
import { Notice } from '../feedback/notice';
import { AuthApi } from './auth-api';
import { AuthFrame } from './auth-frame';
import { PASSWORD_MIN, passwordValidators, passwordsMatch } from './password-rules';

@Component({
  selector: 'ohm-reset-password-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, RouterLink, MatFormFieldModule, MatInputModule, MatButtonModule, MatProgressBarModule, AuthFrame, Notice],
  template: `
    <ohm-auth-frame heading="Choose a new password" [lead]="'At least ' + minLength + ' characters. A short sentence is easier to remember than symbols.'">
      @if (!token()) {
        <ohm-notice tone="error" icon="link_off">
          This page needs the link from your password-reset e-mail. Open the link from the e-mail, or ask for a new one.
        </ohm-notice>
        <a mat-stroked-button routerLink="/forgot-password">Ask for a new link</a>
      } @else {
        @if (problem(); as p) {
          <ohm-notice tone="error" icon="error">
            {{ p.summary }}
            @if (p.status === 400 || p.status === 404 || p.status === 410) {
              <a routerLink="/forgot-password">Ask for a new link.</a>
            }
          </ohm-notice>
        }
        <form [formGroup]="form" (ngSubmit)="save()" novalidate class="auth-form">
          <mat-form-field>
            <mat-label>New password</mat-label>
            <input matInput type="password" formControlName="password" autocomplete="new-password" required />
            @if (form.controls.password.hasError('required')) {
              <mat-error>Choose a password.</mat-error>
            } @else if (form.controls.password.hasError('minlength')) {
              <mat-error>Use at least {{ minLength }} characters.</mat-error>
            } @else if (form.controls.password.hasError('maxlength')) {
              <mat-error>Use at most 72 characters.</mat-error>
            }
          </mat-form-field>
          <mat-form-field>
            <mat-label>Repeat the new password</mat-label>
            <input matInput type="password" formControlName="confirmation" autocomplete="new-password" required />
            @if (form.controls.confirmation.hasError('required')) {
              <mat-error>Type the password again.</mat-error>
            } @else if (form.controls.confirmation.hasError('mismatch')) {
              <mat-error>The two passwords differ.</mat-error>
            }
          </mat-form-field>
          @if (saving()) {
            <mat-progress-bar mode="indeterminate" aria-label="Saving" />
          }
          <button mat-flat-button type="submit" [disabled]="saving()">Save new password</button>
        </form>
      }
    </ohm-auth-frame>
  `,
  styleUrl: './auth-forms.scss',
})
export class ResetPasswordPage {
  private readonly api = inject(AuthApi);
  private readonly router = inject(Router);
  /** From the e-mailed link `?token=`. */
  readonly token = input<string>();
  protected readonly minLength = PASSWORD_MIN;
  protected readonly form = inject(NonNullableFormBuilder).group(
    { password: ['', passwordValidators], confirmation: ['', Validators.required] },
    { validators: passwordsMatch },
  );
  protected readonly saving = signal(false);
  protected readonly problem = signal<ApiProblem | null>(null);

  protected save(): void {
    const token = this.token();
    if (!token) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.saving.set(true);
    this.problem.set(null);
    this.api.resetPassword({ token, newPassword: this.form.getRawValue().password }).subscribe({
      next: () => void this.router.navigate(['/sign-in'], { queryParams: { passwordReset: 1 } }),
      error: (error: unknown) => {
        this.saving.set(false);
        this.problem.set(ApiProblem.from(error));
      },
    });
  }
}
