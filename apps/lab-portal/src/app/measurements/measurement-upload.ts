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
import { RouterLink } from '@angular/router';
import type { MeasurementUploadFields, RejectedFile, Replicate } from '@ohmprint/contracts';
import { ApiProblem } from '@ohmprint/ui';
import { MeasurementsData } from './measurements-data';
import { rejectionText } from './rejection-text';

interface FileRow {
  readonly file: File;
  readonly status: 'waiting' | 'uploading' | 'saved' | 'rejected';
  readonly percent: number;
  readonly message: string;
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
    temperatureC: [20, [Validators.required, Validators.min(-10), Validators.max(90)]],
  });
  private readonly cellId = toSignal(this.form.controls.cellId.valueChanges, { initialValue: '' });
  protected readonly source = toSignal(this.form.controls.cellConstantSource.valueChanges, { initialValue: 'latest-calibration' as const });
  protected readonly selectedCell = computed(() => this.equipment().cells.find((c) => c.id === this.cellId()) ?? null);
  protected readonly rows = signal<FileRow[]>([]);
  protected readonly busy = signal(false);
  protected readonly dragging = signal(false);
  protected readonly waiting = computed(() => this.rows().filter((r) => r.status === 'waiting').length);

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
    const blocked = this.selectedCell()?.control?.state === 'out-of-control';
    return this.form.valid && constantOk && !blocked && this.waiting() > 0 && !this.busy();
  }

  /** Files go one after another: two cores on a bench PC, and the order of replicates stays the order of files. */
  protected uploadAll(): void {
    const v = this.form.getRawValue();
    const fields: MeasurementUploadFields = {
      instrumentId: v.instrumentId,
      cellId: v.cellId,
      cellConstantSource: v.cellConstantSource,
      cellConstantPerCm: v.cellConstantSource === 'entered' ? (v.cellConstantPerCm ?? undefined) : undefined,
      temperatureC: v.temperatureC,
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
          // A request with only this file fails as a whole (400); its field errors carry the file, line and column.
          const p = ApiProblem.from(e);
          const message = p.fieldErrors.length > 0 ? p.fieldErrors.map((f) => f.message).join(' ') : `${row.file.name}: ${p.summary}`;
          this.patch(row.file, { status: 'rejected', percent: 100, message });
          next();
        },
        complete: next,
      });
    };
    next();
  }

  private add(files: File[]): void {
    const known = new Set(this.rows().map((r) => r.file.name));
    const fresh = files.filter((f) => !known.has(f.name)).map((file): FileRow => ({ file, status: 'waiting', percent: 0, message: '' }));
    this.rows.update((rows) => [...rows, ...fresh]);
  }

  private patch(file: File, change: Partial<FileRow>): void {
    this.rows.update((rows) => rows.map((r) => (r.file === file ? { ...r, ...change } : r)));
  }
}
