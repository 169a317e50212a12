import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { FormArray, FormControl, FormGroup, NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatExpansionModule } from '@angular/material/expansion';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { CHEMISTRY_FIELDS, CHEMISTRY_FIELD_NAMES, type Chemistry, type ChemistryField, type NewReferenceLot } from '@ohmprint/contracts';
import { FormSubmission, Notice, Notifier } from '@ohmprint/ui';
import { catchError, map, of, switchMap } from 'rxjs';
import { OrdersData } from '../orders/orders-data';
import { ProductsData } from '../products/products-data';

type ChemistryGroup = FormGroup<Record<ChemistryField, FormControl<number | null>>>;

const today = (): string => new Date().toISOString().slice(0, 10);

/** Declares authentic lots of one product for its reference library; they are priced per lot in credits. */
@Component({
  selector: 'ohm-enrolment-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, RouterLink, MatButtonModule, MatExpansionModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule, Notice],
  templateUrl: './enrolment-page.html',
  styleUrl: './enrolment-page.scss',
})
export class EnrolmentPage {
  /** The product's id, from the route. */
  readonly id = input.required<string>();
  private readonly fb = inject(NonNullableFormBuilder);
  private readonly orders = inject(OrdersData);
  private readonly router = inject(Router);
  private readonly notifier = inject(Notifier);
  protected readonly fields = CHEMISTRY_FIELD_NAMES;
  protected readonly chemistryInfo = CHEMISTRY_FIELDS;
  private readonly products = inject(ProductsData);
  protected readonly product = toSignal(
    toObservable(this.id).pipe(switchMap((id) => this.products.all().pipe(map((all) => all.find((p) => p.id === id) ?? null), catchError(() => of(null))))),
  );
  protected readonly prices = toSignal(this.orders.prices().pipe(catchError(() => of(null))));
  protected readonly lots = new FormArray([this.lotGroup()]);
  protected readonly form = this.fb.group({ lots: this.lots });
  private readonly submission = new FormSubmission(this.form);
  protected readonly saving = this.submission.saving;
  protected readonly problem = this.submission.problem;
  protected readonly count = signal(1);
  protected readonly cost = computed(() => this.count() * (this.prices()?.creditsPerReferenceLot ?? 0));
  protected readonly today = today();

  private lotGroup() {
    const chemistry = this.fb.group(
      Object.fromEntries(CHEMISTRY_FIELD_NAMES.map((f) => [f, new FormControl<number | null>(null, [Validators.min(CHEMISTRY_FIELDS[f].min), Validators.max(CHEMISTRY_FIELDS[f].max)])])) as Record<ChemistryField, FormControl<number | null>>,
    ) as ChemistryGroup;
    return this.fb.group({
      lotCode: ['', [Validators.required, Validators.maxLength(60)]],
      producedOn: ['', Validators.required],
      volumeMl: [750, [Validators.required, Validators.min(1), Validators.max(100000)]],
      notes: ['', Validators.maxLength(2000)],
      chemistry,
    });
  }

  protected addLot(): void {
    this.lots.push(this.lotGroup());
    this.count.set(this.lots.length);
  }

  protected removeLot(i: number): void {
    this.lots.removeAt(i);
    this.count.set(this.lots.length);
  }

  protected unitOf(f: ChemistryField): string {
    const { label, unit } = CHEMISTRY_FIELDS[f];
    return unit ? `${label} (${unit})` : label;
  }

  protected enrol(): void {
    const lots: NewReferenceLot[] = this.lots.getRawValue().map((l) => ({
      lotCode: l.lotCode,
      producedOn: l.producedOn,
      volumeMl: Number(l.volumeMl),
      notes: l.notes,
      chemistry: Object.fromEntries(Object.entries(l.chemistry).filter(([, v]) => v !== null && `${v}` !== '').map(([k, v]) => [k, Number(v)])) as Chemistry,
    }));
    this.submission.submit(
      () => this.orders.placeReferenceOrder({ productId: this.id(), lots }),
      (order) => {
        this.notifier.success(`${order.samples.length} lot${order.samples.length === 1 ? '' : 's'} ordered for enrolment. Print the label pack next.`);
        void this.router.navigate(['/orders', order.id]);
      },
    );
  }
}
