import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { CreateClientOrganisationRequest } from '@ohmprint/contracts';
import { FormSubmission, InviteeEmailField, Notice, firstAdminForm, firstAdminOf } from '@ohmprint/ui';
import { ClientOrganisationsData, type OrganisationCreated } from './client-organisations-data';

@Component({
  selector: 'ohm-invite-organisation-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatProgressBarModule, InviteeEmailField, Notice],
  templateUrl: './invite-organisation-dialog.html',
})
export class InviteOrganisationDialog {
  private readonly data = inject(ClientOrganisationsData);
  private readonly dialogRef = inject<MatDialogRef<InviteOrganisationDialog, OrganisationCreated>>(MatDialogRef);
  private readonly fb = inject(NonNullableFormBuilder);
  protected readonly form = this.fb.group({
    name: ['', [Validators.required, Validators.minLength(2), Validators.maxLength(160)]],
    contactEmail: ['', Validators.email],
    firstAdmin: firstAdminForm(this.fb),
  });
  private readonly submission = new FormSubmission(this.form);
  protected readonly saving = this.submission.saving;
  protected readonly problem = this.submission.problem;

  protected invite(): void {
    const { name, contactEmail, firstAdmin } = this.form.getRawValue();
    const body: CreateClientOrganisationRequest = {
      name,
      ...(contactEmail ? { contactEmail } : {}),
      firstAdmin: firstAdminOf(firstAdmin),
    };
    this.submission.submit(
      () => this.data.create(body),
      (created) => this.dialogRef.close(created),
    );
  }
}
