import { ChangeDetectionStrategy, Component, computed, inject, input, signal, type OnInit } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import type { Me } from '@ohmprint/contracts';
import { ApiProblem } from '../errors/api-problem';
import { Notice } from '../feedback/notice';
import { PORTAL } from '../portal/portal-config';
import { AuthFrame } from './auth-frame';
import { Session, WrongPortalError } from './session';

@Component({
  selector: 'ohm-sign-in-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, RouterLink, MatFormFieldModule, MatInputModule, MatButtonModule, MatIconModule, MatProgressBarModule, AuthFrame, Notice],
  templateUrl: './sign-in-page.html',
  styleUrl: './auth-forms.scss',
})
export class SignInPage implements OnInit {
  private readonly session = inject(Session);
  private readonly router = inject(Router);
  protected readonly portal = inject(PORTAL);

  /** Query parameters (router input binding). */
  readonly returnUrl = input<string>();
  readonly expired = input<string>();
  readonly signedOut = input<string>();
  readonly passwordReset = input<string>();
  readonly email = input<string>();

  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email]],
    password: ['', Validators.required],
  });
  protected readonly saving = signal(false);
  protected readonly problem = signal<ApiProblem | null>(null);
  private readonly wrongPortal = signal<Me | null>(null);
  /** An account for the other portal, from this attempt or from a session restored at start. */
  protected readonly otherPortalAccount = computed(() => this.wrongPortal() ?? this.session.otherPortalAccount());
  protected readonly hidePassword = signal(true);

  ngOnInit(): void {
    const prefill = this.email();
    if (prefill) this.form.controls.email.setValue(prefill);
  }

  protected signIn(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.saving.set(true);
    this.problem.set(null);
    this.wrongPortal.set(null);
    const { email, password } = this.form.getRawValue();
    this.session.signIn(email, password).subscribe({
      next: () => {
        this.saving.set(false);
        void this.router.navigateByUrl(safeReturnUrl(this.returnUrl()));
      },
      error: (error: unknown) => {
        this.saving.set(false);
        if (error instanceof WrongPortalError) this.wrongPortal.set(error.user);
        else this.problem.set(ApiProblem.from(error));
      },
    });
  }
}

/** Only paths inside this portal; anything else (another host, a scheme) goes home. */
function safeReturnUrl(url: string | undefined): string {
  return url && url.startsWith('/') && !url.startsWith('//') && !url.startsWith('/sign-in') ? url : '/';
}
