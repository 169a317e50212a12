import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal, type OnInit } from '@angular/core';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { ActivatedRoute } from '@angular/router';
import { ReportNumberSchema, VerificationCodeSchema, type VerificationResult } from '@ohmprint/contracts';
import { ApiProblem, ScreeningCaution, VERDICT_LOOK } from '@ohmprint/ui';
import { fileVerdict, outcomeLook } from './verification-look';
import { VerifyData } from './verify-data';

/** Anyone holding a report checks it here: from the QR link, by typing number and code, or with the PDF. */
@Component({
  selector: 'ohm-verify-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, ReactiveFormsModule, MatButtonModule, MatCardModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule, ScreeningCaution],
  templateUrl: './verify-page.html',
  styleUrl: './verify-page.scss',
})
export class VerifyPage implements OnInit {
  private readonly data = inject(VerifyData);
  private readonly route = inject(ActivatedRoute);
  protected readonly form = inject(FormBuilder).nonNullable.group({
    report: ['', Validators.required],
    code: ['', Validators.required],
  });
  protected readonly checking = signal(false);
  protected readonly result = signal<VerificationResult | null>(null);
  protected readonly problem = signal<string | null>(null);
  protected readonly dragging = signal(false);
  protected readonly fileName = signal<string | null>(null);
  protected readonly look = computed(() => (this.result() ? outcomeLook(this.result()!) : null));
  protected readonly fileText = computed(() => (this.result() ? fileVerdict(this.result()!) : null));
  protected readonly verdictLook = VERDICT_LOOK;

  ngOnInit(): void {
    const q = this.route.snapshot.queryParamMap;
    const report = q.get('report');
    const code = q.get('code');
    if (report && code) {
      this.form.setValue({ report, code });
      this.check();
    }
  }

  protected check(): void {
    const report = ReportNumberSchema.safeParse(this.form.controls.report.value);
    const code = VerificationCodeSchema.safeParse(this.form.controls.code.value);
    if (!report.success) this.form.controls.report.setErrors({ format: report.error.issues[0].message });
    if (!code.success) this.form.controls.code.setErrors({ format: code.error.issues[0].message });
    if (!report.success || !code.success) {
      this.form.markAllAsTouched();
      return;
    }
    this.fileName.set(null);
    this.run(this.data.byCode(report.data, code.data));
  }

  protected picked(event: Event): void {
    const el = event.target as HTMLInputElement;
    const file = el.files?.[0];
    el.value = '';
    if (file) this.checkFile(file);
  }

  protected dropped(event: DragEvent): void {
    event.preventDefault();
    this.dragging.set(false);
    const file = event.dataTransfer?.files?.[0];
    if (file) this.checkFile(file);
  }

  private checkFile(file: File): void {
    if (file.type && file.type !== 'application/pdf') {
      this.problem.set(`${file.name} is not a PDF. Upload the report file exactly as you received it.`);
      this.result.set(null);
      return;
    }
    this.fileName.set(file.name);
    const report = ReportNumberSchema.safeParse(this.form.controls.report.value);
    const code = VerificationCodeSchema.safeParse(this.form.controls.code.value);
    this.run(this.data.byFile(file, report.success ? report.data : undefined, code.success ? code.data : undefined));
  }

  private run(call: ReturnType<VerifyData['byCode']>): void {
    this.checking.set(true);
    this.problem.set(null);
    this.result.set(null);
    call.subscribe({
      next: (r) => {
        this.checking.set(false);
        this.result.set(r);
      },
      error: (e: unknown) => {
        this.checking.set(false);
        this.problem.set(ApiProblem.from(e).summary);
      },
    });
  }
}
