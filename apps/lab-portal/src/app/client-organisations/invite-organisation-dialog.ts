import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { CreateClientOrganisationRequest } from '@ohmprint/contracts';
import { ApiProblem, Notice, showFieldErrors } from '@ohmprint/ui';
import { ClientOrganisationsData, type OrganisationCreated } from './client-organisations-data';

@Component({
  selector: 'ohm-invite-organisation-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatProgressBarModule, Notice],
  templateUrl: './invite-organisation-dialog.html',
})
export class InviteOrganisationDialog {
  private readonly data = inject(ClientOrganisationsData);
  private readonly dialogRef = inject<MatDialogRef<InviteOrganisationDialog, OrganisationCreated>>(MatDialogRef);
  private readonly fb = inject(NonNullableFormBuilder);
  protected readonly form = this.fb.group({
    name: ['', [Validators.required, Validators.minLength(2), Validators.maxLength(160)]],
    contactEmail: ['', Validators.email],
    firstAdmin: this.fb.group({
      email: ['', [Validators.required, Validators.email]],
      displayName: ['', Validators.maxLength(120)],
    }),
  });
  protected readonly saving = signal(false);
  protected readonly problem = signal<ApiProblem | null>(null);

  protected invite(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { name, contactEmail, firstAdmin } = this.form.getRawValue();
    const body: CreateClientOrganisationRequest = {
      name,
      ...(contactEmail ? { contactEmail } : {}),
      firstAdmin: { email: firstAdmin.email, ...(firstAdmin.displayName ? { displayName: firstAdmin.displayName } : {}) },
    };
    this.saving.set(true);
    this.problem.set(null);
    this.data.create(body).subscribe({
      next: (created) => this.dialogRef.close(created),
      error: (error: unknown) => {
        const problem = ApiProblem.from(error);
        this.saving.set(false);
        this.problem.set(problem);
        showFieldErrors(this.form, problem);
      },
    });
  }
}
