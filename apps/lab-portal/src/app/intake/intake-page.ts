import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, ElementRef, inject, signal, viewChild, type AfterViewInit, type OnInit } from '@angular/core';
import { FormBuilder, FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { ActivatedRoute, RouterLink } from '@angular/router';
import { MATRIX_LABELS, CHEMISTRY_FIELDS,
  CONTAINER_CONDITION_LABELS,
  CONTAINER_CONDITIONS,
  SampleCodeSchema,
  type ChemistryField,
  type CustodyEvent,
  type ReferenceLotDeclaration,
  type SampleDetail, } from '@ohmprint/contracts';
import { ApiProblem, Notice, Notifier, SAMPLE_STATE_LOOK, SampleStateChip, showFieldErrors } from '@ohmprint/ui';
import { CustodyTimeline } from './custody-timeline';
import { IntakeData } from './intake-data';
import { IntakePhotos } from './intake-photos';
import { PhotoPicker } from './photo-picker';
import { RejectDialog } from './reject-dialog';
import { toLocalInput } from './local-time';

/**
 * Made for the bench: the code field keeps focus, a USB scanner types the code and Enter, and after
 * every decision focus returns to the code field for the next parcel.
 */
@Component({
  selector: 'ohm-intake-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe, ReactiveFormsModule, RouterLink, MatButtonModule, MatCardModule, MatCheckboxModule, MatFormFieldModule,
    MatIconModule, MatInputModule, MatProgressBarModule, MatSelectModule, Notice, SampleStateChip, CustodyTimeline, IntakePhotos, PhotoPicker,
  ],
  templateUrl: './intake-page.html',
  styleUrl: './intake-page.scss',
})
export class IntakePage implements OnInit, AfterViewInit {
  protected readonly matrixLabel = MATRIX_LABELS;
  private readonly data = inject(IntakeData);
  private readonly notifier = inject(Notifier);
  private readonly dialog = inject(MatDialog);
  private readonly route = inject(ActivatedRoute);
  private readonly codeInput = viewChild.required<ElementRef<HTMLInputElement>>('codeInput');
  private readonly fb = inject(FormBuilder).nonNullable;

  protected readonly conditions = CONTAINER_CONDITIONS;
  protected readonly conditionLabels = CONTAINER_CONDITION_LABELS;
  protected readonly stateLook = SAMPLE_STATE_LOOK;
  protected readonly code = new FormControl('', { nonNullable: true });
  protected readonly scan = new FormGroup({ code: this.code });
  protected readonly codeError = signal<string | null>(null);
  protected readonly looking = signal(false);
  protected readonly saving = signal(false);
  protected readonly sample = signal<SampleDetail | null>(null);
  protected readonly custody = signal<readonly CustodyEvent[]>([]);
  protected readonly photos = signal<File[]>([]);
  protected readonly lastDone = signal<string | null>(null);

  protected readonly arrival = this.fb.group({
    carrier: ['', [Validators.required, Validators.maxLength(100)]],
    trackingNumber: ['', Validators.maxLength(100)],
    arrivedAt: [toLocalInput(new Date()), Validators.required],
    temperatureC: [4, [Validators.required, Validators.min(-40), Validators.max(80)]],
    sealIntact: [true],
    containerCondition: ['intact' as (typeof CONTAINER_CONDITIONS)[number], Validators.required],
    volumeMl: [750, [Validators.required, Validators.min(0.1), Validators.max(100000)]],
    notes: ['', Validators.maxLength(2000)],
  });
  protected readonly storage = this.fb.group({
    storageLocation: ['', [Validators.required, Validators.maxLength(200)]],
    overrideReason: ['', Validators.maxLength(2000)],
  });

  ngOnInit(): void {
    const code = this.route.snapshot.queryParamMap.get('code');
    if (code) {
      this.code.setValue(code);
      this.lookUp();
    }
  }

  ngAfterViewInit(): void {
    this.codeInput().nativeElement.focus();
  }

  protected lookUp(): void {
    const parsed = SampleCodeSchema.safeParse(this.code.value);
    if (!parsed.success) {
      this.codeError.set(`“${this.code.value.trim()}” is not a sample code: ${parsed.error.issues[0].message}.`);
      this.selectCode();
      return;
    }
    this.codeError.set(null);
    this.looking.set(true);
    this.data.findByCode(parsed.data).subscribe({
      next: (s) => {
        this.looking.set(false);
        this.show(s);
      },
      error: (e: unknown) => {
        this.looking.set(false);
        const p = ApiProblem.from(e);
        this.sample.set(null);
        this.codeError.set(p.status === 404 ? `No sample with code ${parsed.data} in this lab. Check the label and scan again.` : p.summary);
        this.selectCode();
      },
    });
  }

  protected recordArrival(): void {
    const s = this.sample();
    if (!s || this.arrival.invalid) return;
    const v = this.arrival.getRawValue();
    this.saving.set(true);
    this.data.recordArrival(s.id, { ...v, arrivedAt: new Date(v.arrivedAt).toISOString() }).subscribe({
      next: (updated) => {
        this.saving.set(false);
        this.notifier.success(`Arrival of ${updated.code} recorded.`);
        this.uploadPhotos(updated);
        this.show(updated);
      },
      error: (e: unknown) => this.failed(e, this.arrival),
    });
  }

  protected accept(): void {
    const s = this.sample();
    if (!s || this.storage.invalid) return;
    this.saving.set(true);
    const { storageLocation, overrideReason } = this.storage.getRawValue();
    const body = s.intakeWarnings.length ? { storageLocation, overrideReason } : { storageLocation };
    this.data.accept(s.id, body).subscribe({
      next: (updated) => this.decided(`${updated.code} accepted and stored at ${updated.storageLocation}.`),
      error: (e: unknown) => this.failed(e, this.storage),
    });
  }

  protected reject(): void {
    const s = this.sample();
    if (!s) return;
    this.dialog
      .open<RejectDialog, SampleDetail, SampleDetail>(RejectDialog, { data: s })
      .afterClosed()
      .subscribe((updated) => {
        if (updated) this.decided(`${updated.code} rejected. The client is told why and the credit is returned.`);
        else this.selectCode();
      });
  }

  protected custodyRecorded(event: CustodyEvent): void {
    this.custody.update((list) => [...list, event]);
  }

  /** The chemistry the producer declared for a reference lot, with units, or null when none. */
  protected chemistryOf(lot: ReferenceLotDeclaration): string | null {
    const parts = (Object.entries(lot.chemistry) as [ChemistryField, number | undefined][])
      .filter(([, v]) => v !== undefined)
      .map(([k, v]) => `${CHEMISTRY_FIELDS[k].label} ${v}${CHEMISTRY_FIELDS[k].unit ? ' ' + CHEMISTRY_FIELDS[k].unit : ''}`);
    return parts.length ? parts.join(' · ') : null;
  }

  protected nextSample(): void {
    this.sample.set(null);
    this.code.setValue('');
    this.selectCode();
  }

  private show(s: SampleDetail): void {
    this.sample.set(s);
    this.photos.set([]);
    this.data.custody(s.id).subscribe((t) => this.custody.set(t.events));
    if (s.state === 'awaiting-arrival') {
      // What the client said about the parcel is the best first guess; the technician corrects it from the label in hand.
      const shipped = s.shipment ? { carrier: s.shipment.carrier, trackingNumber: s.shipment.trackingNumber } : {};
      this.arrival.reset({ ...this.arrival.getRawValue(), ...shipped, arrivedAt: toLocalInput(new Date()) });
    }
  }

  private uploadPhotos(s: SampleDetail): void {
    const files = this.photos();
    if (files.length === 0) return;
    this.data.uploadPhotos(s.id, files).subscribe((saved) => {
      this.notifier.success(`${saved.length} photo${saved.length === 1 ? '' : 's'} saved with the intake record.`);
      this.sample.update((cur) => (cur && cur.id === s.id ? { ...cur, photos: [...cur.photos, ...saved] } : cur));
    });
    this.photos.set([]);
  }

  private decided(message: string): void {
    this.saving.set(false);
    this.notifier.success(message);
    this.lastDone.set(message);
    this.storage.reset();
    this.nextSample();
  }

  private failed(e: unknown, form: typeof this.arrival | typeof this.storage): void {
    this.saving.set(false);
    const p = ApiProblem.from(e);
    showFieldErrors(form, p);
    this.notifier.problem(p);
  }

  private selectCode(): void {
    queueMicrotask(() => this.codeInput().nativeElement.select());
  }
}
