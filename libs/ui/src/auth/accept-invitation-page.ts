import { ChangeDetectionStrategy, Component, inject, input, signal, type OnInit } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import type { InvitationPreview } from '@ohmprint/contracts';
import { ApiProblem } from '../errors/api-problem';
import { showFieldErrors } from '../errors/form-problems';
import { Notifier } from '../errors/notifier';
import { Notice } from '../feedback/notice';
import { AuthApi } from './auth-api';
import { AuthFrame } from './auth-frame';
import { PASSWORD_MIN, passwordValidators, passwordsMatch } from './password-rules';
import { roleList } from './role-labels';
import { Session } from './session';

@Component({
  selector: 'ohm-accept-invitation-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, RouterLink, MatFormFieldModule, MatInputModule, MatButtonModule, MatProgressBarModule, AuthFrame, Notice],
  templateUrl: './accept-invitation-page.html',
  styleUrl: './auth-forms.scss',
})
export class AcceptInvitationPage implements OnInit {
  private readonly api = inject(AuthApi);
  private readonly router = inject(Router);
  private readonly session = inject(Session);
  private readonly notifier = inject(Notifier);
  /** From the e-mailed link `?token=`. */
  readonly token = input<string>();
  protected readonly minLength = PASSWORD_MIN;
  protected readonly roleList = roleList;
  protected readonly invitation = signal<InvitationPreview | null>(null);
  protected readonly loading = signal(true);
  protected readonly loadProblem = signal<ApiProblem | null>(null);
  protected readonly problem = signal<ApiProblem | null>(null);
  protected readonly saving = signal(false);
  protected readonly form = inject(NonNullableFormBuilder).group(
    {
      displayName: ['', [Validators.required, Validators.maxLength(120)]],
      password: ['', passwordValidators],
      confirmation: ['', Validators.required],
    },
    { validators: passwordsMatch },
  );

  ngOnInit(): void {
    const token = this.token();
    if (!token) {
      this.loading.set(false);
      return;
    }
    this.api.previewInvitation(token).subscribe({
      next: (preview) => {
        this.invitation.set(preview);
        if (preview.displayName && !this.form.controls.displayName.value) this.form.controls.displayName.setValue(preview.displayName);
        this.loading.set(false);
      },
      error: (error: unknown) => {
        this.loadProblem.set(ApiProblem.from(error));
        this.loading.set(false);
      },
    });
  }

  protected accept(): void {
    const token = this.token();
    const invitation = this.invitation();
    if (!token || !invitation) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { displayName, password } = this.form.getRawValue();
    this.saving.set(true);
    this.problem.set(null);
    this.api.acceptInvitation({ token, displayName, password }).subscribe({
      next: (response) => {
        try {
          const me = this.session.adopt(response);
          this.notifier.success(`Welcome, ${me.displayName}. Your account is ready.`);
          void this.router.navigate(['/']);
        } catch {
          // The sign-in screen explains which portal this account belongs to.
          void this.router.navigate(['/sign-in'], { queryParams: { email: invitation.email } });
        }
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
