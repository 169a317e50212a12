import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { CreateLabRequest } from '@ohmprint/contracts';
import { FormSubmission, InviteeEmailField, Notice, firstAdminForm, firstAdminOf } from '@ohmprint/ui';
import { LabsData, type LabCreated } from './labs-data';

@Component({
  selector: 'ohm-create-lab-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatProgressBarModule, InviteeEmailField, Notice],
  templateUrl: './create-lab-dialog.html',
})
export class CreateLabDialog {
  private readonly data = inject(LabsData);
  private readonly dialogRef = inject<MatDialogRef<CreateLabDialog, LabCreated>>(MatDialogRef);
  private readonly fb = inject(NonNullableFormBuilder);
  protected readonly form = this.fb.group({
    name: ['', [Validators.required, Validators.minLength(2), Validators.maxLength(120)]],
    legalName: ['', [Validators.required, Validators.minLength(2), Validators.maxLength(200)]],
    address: ['', [Validators.required, Validators.minLength(5), Validators.maxLength(500)]],
    accreditationBody: ['', Validators.maxLength(120)],
    accreditationNumber: ['', Validators.maxLength(60)],
    turnaroundTargetDays: [10, [Validators.required, Validators.min(1), Validators.max(90)]],
    firstAdmin: firstAdminForm(this.fb),
  });
  private readonly submission = new FormSubmission(this.form);
  protected readonly saving = this.submission.saving;
  protected readonly problem = this.submission.problem;

  protected create(): void {
    const v = this.form.getRawValue();
    const body: CreateLabRequest = {
      name: v.name,
      legalName: v.legalName,
      address: v.address,
      turnaroundTargetDays: Number(v.turnaroundTargetDays),
      ...(v.accreditationBody ? { accreditationBody: v.accreditationBody } : {}),
      ...(v.accreditationNumber ? { accreditationNumber: v.accreditationNumber } : {}),
      firstAdmin: firstAdminOf(v.firstAdmin),
    };
    this.submission.submit(
      () => this.data.create(body),
      (created) => this.dialogRef.close(created),
    );
  }
}
