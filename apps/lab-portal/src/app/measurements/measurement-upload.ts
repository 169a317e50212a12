import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatRadioModule } from '@angular/material/radio';
import { MatSelectModule } from '@angular/material/select';
import { SAMPLE_CODE_PATTERN, type MeasurementUploadFields, type RejectedFile, type Replicate, type UploadConfirmation } from '@ohmprint/contracts';
import { readExportMetadata, type ExportMetadata } from '@ohmprint/spectral-engine';
import { RouterLink } from '@angular/router';
import { ApiProblem } from '@ohmprint/ui';
import { MeasurementsData } from './measurements-data';
import { rejectionText } from './rejection-text';

interface FileRow {
  readonly file: File;
  readonly status: 'waiting' | 'uploading' | 'saved' | 'rejected' | 'needs-reason';
  readonly percent: number;
  readonly message: string;
  /** What the file says about itself, read in the browser before upload (the API reads it again). */
  readonly read: ExportMetadata | null;
  /** Set when the API asks for a confirmation: what to confirm. */
  readonly confirm: UploadConfirmation['about'] | null;
  readonly reason: string;
}

/** Exports are small text files; anything larger is left to the API's own limit and message. */
const READ_LIMIT_BYTES = 5 * 1048576;

/** "sample OP-8MJA-4T (line 3) · 19 °C (line 3) · Invented IA-200" — what the browser read. */
export function readSummary(read: ExportMetadata | null): string {
  if (!read) return '';
  const codes = [...new Set([...read.fileNameCodes, ...(read.sample?.codes ?? [])])];
  const parts = [
    codes.length ? `names ${codes.join(', ')}` : read.sample ? `sample “${read.sample.text}”` : 'names no sample code',
    read.temperature ? `${Number(read.temperature.celsius.toFixed(2))} °C (line ${read.temperature.line})` : 'no temperature stated',
    read.instrument ? read.instrument.text : null,
    read.measuredAt ? (read.measuredAt.iso ?? read.measuredAt.text) : null,
  ];
  return parts.filter(Boolean).join(' · ');
}

/** Several instrument exports at once, one replicate each, with a progress bar and an answer per file. */
@Component({
  selector: 'ohm-measurement-upload',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule, MatRadioModule, MatSelectModule, RouterLink],
  templateUrl: './measurement-upload.html',
  styleUrl: './measurement-upload.scss',
})
export class MeasurementUpload {
  private readonly data = inject(MeasurementsData);
  readonly sampleId = input.required<string>();
  readonly uploaded = output<Replicate[]>();

  protected readonly equipment = toSignal(this.data.equipment(), { initialValue: { instruments: [], cells: [] } });
  protected readonly form = inject(FormBuilder).nonNullable.group({
    instrumentId: ['', Validators.required],
    cellId: ['', Validators.required],
    cellConstantSource: ['latest-calibration' as MeasurementUploadFields['cellConstantSource']],
    cellConstantPerCm: [null as number | null, [Validators.min(0.0001), Validators.max(1000)]],
    // empty by default: files that state their temperature bring their own; no silent 20 °C
    temperatureC: [null as number | null, [Validators.min(-10), Validators.max(90)]],
  });
  private readonly cellId = toSignal(this.form.controls.cellId.valueChanges, { initialValue: '' });
  protected readonly source = toSignal(this.form.controls.cellConstantSource.valueChanges, { initialValue: 'latest-calibration' as const });
  protected readonly selectedCell = computed(() => this.equipment().cells.find((c) => c.id === this.cellId()) ?? null);
  protected readonly rows = signal<FileRow[]>([]);
  protected readonly busy = signal(false);
  protected readonly dragging = signal(false);
  protected readonly waiting = computed(() => this.rows().filter((r) => r.status === 'waiting').length);
  private readonly typedTemperature = toSignal(this.form.controls.temperatureC.valueChanges, { initialValue: null as number | null });
  /** Waiting files that state no temperature: they need the typed one. */
  protected readonly needTemperature = computed(() => this.rows().filter((r) => r.status === 'waiting' && r.read !== null && !r.read.temperature).map((r) => r.file.name));
  protected readonly fileTemperatures = computed(() => [
    ...new Set(this.rows().flatMap((r) => (r.read?.temperature ? [Number(r.read.temperature.celsius.toFixed(2))] : []))),
  ]);
  protected readonly summary = readSummary;

  protected picked(event: Event): void {
    const el = event.target as HTMLInputElement;
    this.add(Array.from(el.files ?? []));
    el.value = '';
  }

  protected dropped(event: DragEvent): void {
    event.preventDefault();
    this.dragging.set(false);
    this.add(Array.from(event.dataTransfer?.files ?? []));
  }

  protected remove(row: FileRow): void {
    this.rows.update((rows) => rows.filter((r) => r !== row));
  }

  protected canUpload(): boolean {
    const v = this.form.getRawValue();
    const constantOk = v.cellConstantSource === 'latest-calibration' ? !!this.selectedCell()?.latestCalibration : v.cellConstantPerCm !== null;
    const temperatureOk = this.needTemperature().length === 0 || this.typedTemperature() !== null;
    const blocked = this.selectedCell()?.control?.state === 'out-of-control';
    return this.form.valid && constantOk && temperatureOk && !blocked && this.waiting() > 0 && !this.busy();
  }

  protected setReason(row: FileRow, event: Event): void {
    this.patch(row.file, { reason: (event.target as HTMLInputElement).value });
  }

  /** Sends the refused file again with the analyst's reason (audited by the API). */
  protected keep(row: FileRow): void {
    if (!row.confirm || row.reason.trim().length < 5) return;
    this.patch(row.file, { status: 'waiting', message: '' });
    this.uploadAll([{ fileName: row.file.name, about: row.confirm, reason: row.reason.trim() }]);
  }

  /** Files go one after another: two cores on a bench PC, and the order of replicates stays the order of files. */
  protected uploadAll(confirmations: UploadConfirmation[] = []): void {
    const v = this.form.getRawValue();
    const fields: MeasurementUploadFields = {
      instrumentId: v.instrumentId,
      cellId: v.cellId,
      cellConstantSource: v.cellConstantSource,
      cellConstantPerCm: v.cellConstantSource === 'entered' ? (v.cellConstantPerCm ?? undefined) : undefined,
      temperatureC: v.temperatureC ?? undefined,
      confirmations,
    };
    this.busy.set(true);
    const saved: Replicate[] = [];
    const next = () => {
      const row = this.rows().find((r) => r.status === 'waiting');
      if (!row) {
        this.busy.set(false);
        if (saved.length > 0) this.uploaded.emit(saved);
        return;
      }
      this.patch(row.file, { status: 'uploading', percent: 0 });
      this.data.upload(this.sampleId(), fields, row.file).subscribe({
        next: (p) => {
          if (p.kind === 'progress') {
            this.patch(row.file, { percent: p.percent });
            return;
          }
          saved.push(...p.result.saved);
          const refused: RejectedFile | undefined = p.result.rejected[0];
          this.patch(
            row.file,
            refused
              ? { status: 'rejected', percent: 100, message: rejectionText(refused) }
              : { status: 'saved', percent: 100, message: `Saved as replicate ${p.result.saved.map((s) => s.replicateNumber).join(', ')}.` },
          );
        },
        error: (e: unknown) => {
          // A request with only this file fails as a whole (400 or 409); its field errors carry the file, line and column.
          const p = ApiProblem.from(e);
          const message = p.fieldErrors.length > 0 ? p.fieldErrors.map((f) => f.message).join(' ') : `${row.file.name}: ${p.summary}`;
          const confirm = confirmationAsked(e);
          this.patch(row.file, { status: confirm ? 'needs-reason' : 'rejected', percent: 100, message, confirm, reason: '' });
          next();
        },
        complete: next,
      });
    };
    next();
  }

  private add(files: File[]): void {
    const known = new Set(this.rows().map((r) => r.file.name));
    const fresh = files.filter((f) => !known.has(f.name)).map((file): FileRow => ({ file, status: 'waiting', percent: 0, message: '', read: null, confirm: null, reason: '' }));
    this.rows.update((rows) => [...rows, ...fresh]);
    for (const row of fresh) {
      if (row.file.size > READ_LIMIT_BYTES) continue;
      row.file.text().then(
        (text) => this.patch(row.file, { read: readExportMetadata(row.file.name, text, { codePattern: SAMPLE_CODE_PATTERN }) }),
        () => undefined,
      );
    }
  }

  private patch(file: File, change: Partial<FileRow>): void {
    this.rows.update((rows) => rows.map((r) => (r.file === file ? { ...r, ...change } : r)));
  }
}

/** The confirmation a refusal asks for: a file naming another sample, or a typed temperature far from the file's. */
function confirmationAsked(e: unknown): UploadConfirmation['about'] | null {
  const problem = ApiProblem.from(e).members['problem'];
  if (problem === 'other-sample') return 'sample-code';
  if (problem === 'temperature-mismatch') return 'temperature';
  return null;
}
