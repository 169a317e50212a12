import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { AuthApi } from '../auth/auth-api';
import { passwordValidators, passwordsMatch, PASSWORD_MIN } from '../auth/password-rules';
import { roleList } from '../auth/role-labels';
import { Session } from '../auth/session';
import { ApiProblem } from '../errors/api-problem';
import { showFieldErrors } from '../errors/form-problems';
import { Notifier } from '../errors/notifier';

@Component({
  selector: 'ohm-profile-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatCardModule, MatFormFieldModule, MatInputModule, MatButtonModule],
  templateUrl: './profile-page.html',
  styleUrl: './profile-page.scss',
})
export class ProfilePage {
  private readonly api = inject(AuthApi);
  private readonly session = inject(Session);
  private readonly notifier = inject(Notifier);
  private readonly fb = inject(NonNullableFormBuilder);

  protected readonly user = this.session.user;
  protected readonly roleList = roleList;
  protected readonly minLength = PASSWORD_MIN;
  protected readonly nameForm = this.fb.group({
    displayName: [this.session.user()?.displayName ?? '', [Validators.required, Validators.maxLength(120)]],
  });
  protected readonly passwordForm = this.fb.group(
    {
      currentPassword: ['', Validators.required],
      password: ['', passwordValidators],
      confirmation: ['', Validators.required],
    },
    { validators: passwordsMatch },
  );
  protected readonly savingName = signal(false);
  protected readonly savingPassword = signal(false);

  protected saveName(): void {
    if (this.nameForm.invalid) {
      this.nameForm.markAllAsTouched();
      return;
    }
    this.savingName.set(true);
    this.api.updateMe(this.nameForm.getRawValue()).subscribe({
      next: (me) => {
        this.session.updateUser(me);
        this.savingName.set(false);
        this.nameForm.markAsPristine();
        this.notifier.success('Your name was saved.');
      },
      error: (error: unknown) => {
        const problem = ApiProblem.from(error);
        this.savingName.set(false);
        showFieldErrors(this.nameForm, problem);
        this.notifier.problem(problem);
      },
    });
  }

  protected changePassword(): void {
    if (this.passwordForm.invalid) {
      this.passwordForm.markAllAsTouched();
      return;
    }
    const { currentPassword, password } = this.passwordForm.getRawValue();
    this.savingPassword.set(true);
    this.api.changePassword({ currentPassword, newPassword: password }).subscribe({
      next: (response) => {
        this.session.adopt(response);
        this.savingPassword.set(false);
        this.passwordForm.reset();
        this.notifier.success('Your password was changed. Other devices were signed out.');
      },
      error: (error: unknown) => {
        const problem = ApiProblem.from(error);
        this.savingPassword.set(false);
        showFieldErrors(this.passwordForm, problem, { newPassword: 'password' });
        this.notifier.problem(problem);
      },
    });
  }
}
