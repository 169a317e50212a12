import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { LAB_LOGO_MAX_BYTES, type LabProfile, type UpdateLabProfileRequest } from '@ohmprint/contracts';
import { ApiProblem, Notice, Notifier, showFieldErrors } from '@ohmprint/ui';

import { LabSettingsData } from './lab-settings-data';

const LOGO_LIMIT = `${LAB_LOGO_MAX_BYTES / 1024} KB`;

/** The lab's own profile: what reports, e-mails and the label pack say about the lab. */
@Component({
  selector: 'ohm-lab-profile-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule, Notice],
  templateUrl: './lab-profile-page.html',
  styleUrl: './lab-profile-page.scss',
})
export class LabProfilePage {
  private readonly data = inject(LabSettingsData);
  private readonly notifier = inject(Notifier);
  private readonly fb = inject(NonNullableFormBuilder);

  protected readonly logoLimit = LOGO_LIMIT;
  protected readonly profile = signal<LabProfile | null>(null);
  protected readonly logoUrl = signal<string | null>(null);
  protected readonly saving = signal(false);
  protected readonly logoBusy = signal(false);
  protected readonly logoProblem = signal<string | null>(null);
  protected readonly dragging = signal(false);

  protected readonly form = this.fb.group({
    name: ['', [Validators.required, Validators.minLength(2), Validators.maxLength(120)]],
    legalName: ['', [Validators.required, Validators.minLength(2), Validators.maxLength(200)]],
    address: ['', [Validators.required, Validators.minLength(5), Validators.maxLength(500)]],
    accreditationBody: ['', [Validators.maxLength(120)]],
    accreditationNumber: ['', [Validators.maxLength(60)]],
    contactEmail: ['', [Validators.email, Validators.maxLength(200)]],
    contactPhone: ['', [Validators.maxLength(40), Validators.pattern(/^[0-9+()\-.\s]*(ext\.?\s*[0-9]+)?$/i)]],
    shippingAddress: ['', [Validators.maxLength(500)]],
    shippingInstructions: ['', [Validators.maxLength(2000)]],
    turnaroundTargetDays: [7, [Validators.required, Validators.min(1), Validators.max(90)]],
  });

  constructor() {
    this.data.profile().subscribe((p) => this.adopt(p, true));
  }

  protected errorOf(name: keyof typeof this.form.controls): string | null {
    const c = this.form.controls[name];
    if (!c.errors || !c.touched) return null;
    if (c.errors['server']) return String(c.errors['server']);
    if (c.errors['required']) return 'Required.';
    if (c.errors['email']) return 'Must be an e-mail address.';
    if (c.errors['pattern']) return 'Digits, spaces and + ( ) - . only.';
    if (c.errors['minlength']) return `At least ${c.errors['minlength'].requiredLength} characters.`;
    if (c.errors['maxlength']) return `At most ${c.errors['maxlength'].requiredLength} characters.`;
    if (c.errors['min'] || c.errors['max']) return 'Between 1 and 90 days.';
    return 'Not valid.';
  }

  protected save(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const v = this.form.getRawValue();
    const changes: UpdateLabProfileRequest = {
      ...v,
      accreditationBody: v.accreditationBody.trim() || null,
      accreditationNumber: v.accreditationNumber.trim() || null,
      turnaroundTargetDays: Number(v.turnaroundTargetDays),
    };
    this.saving.set(true);
    this.data.saveProfile(changes).subscribe({
      next: (p) => {
        this.saving.set(false);
        this.adopt(p, false);
        this.form.markAsPristine();
        this.notifier.success('The lab profile was saved.');
      },
      error: (e: unknown) => {
        this.saving.set(false);
        const problem = ApiProblem.from(e);
        showFieldErrors(this.form, problem);
        this.notifier.problem(problem);
      },
    });
  }

  protected picked(event: Event): void {
    const input = event.target as HTMLInputElement;
    const file = input.files?.[0];
    input.value = '';
    if (file) this.upload(file);
  }

  protected dropped(event: DragEvent): void {
    event.preventDefault();
    this.dragging.set(false);
    const file = event.dataTransfer?.files?.[0];
    if (file) this.upload(file);
  }

  protected dragOver(event: DragEvent): void {
    event.preventDefault();
    this.dragging.set(true);
  }

  protected removeLogo(): void {
    this.logoBusy.set(true);
    this.data.removeLogo().subscribe({
      next: (p) => {
        this.logoBusy.set(false);
        this.adopt(p, false);
        this.notifier.success('Logo removed: reports now carry the lab’s name only.');
      },
      error: () => this.logoBusy.set(false),
    });
  }

  private upload(file: File): void {
    this.logoProblem.set(null);
    if (file.size > LAB_LOGO_MAX_BYTES) {
      this.logoProblem.set(`${file.name} is larger than ${LOGO_LIMIT}.`);
      return;
    }
    this.logoBusy.set(true);
    this.data.uploadLogo(file).subscribe({
      next: (p) => {
        this.logoBusy.set(false);
        this.adopt(p, false);
        this.notifier.success('Logo saved: the next report carries it in its header.');
      },
      error: (e: unknown) => {
        this.logoBusy.set(false);
        this.logoProblem.set(ApiProblem.from(e).summary);
      },
    });
  }

  private adopt(p: LabProfile, fillForm: boolean): void {
    const previousLogo = this.profile()?.logo?.updatedAt;
    this.profile.set(p);
    if (fillForm) {
      this.form.reset({
        name: p.name,
        legalName: p.legalName,
        address: p.address,
        accreditationBody: p.accreditationBody ?? '',
        accreditationNumber: p.accreditationNumber ?? '',
        contactEmail: p.contactEmail,
        contactPhone: p.contactPhone,
        shippingAddress: p.shippingAddress,
        shippingInstructions: p.shippingInstructions,
        turnaroundTargetDays: p.turnaroundTargetDays,
      });
    }
    if (!p.logo) this.logoUrl.set(null);
    else if (p.logo.updatedAt !== previousLogo) this.data.logoDataUrl().subscribe({ next: (url) => this.logoUrl.set(url), error: () => this.logoUrl.set(null) });
  }
}
