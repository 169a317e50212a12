import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { FormArray, FormControl, NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatRadioModule } from '@angular/material/radio';
import { MatStepperModule } from '@angular/material/stepper';
import { ActivatedRoute, Router, RouterLink } from '@angular/router';
import { MATRIX_LABELS, type OrderSummary, type ProductSummary } from '@ohmprint/contracts';
import { ApiProblem, Notice, Notifier, showFieldErrors } from '@ohmprint/ui';
import { catchError, concatMap, from, last, of, startWith } from 'rxjs';
import { ProductsData } from '../../products/products-data';
import { OrdersData } from '../orders-data';
import { CheckDraftStore, type DraftSample } from './check-draft';

const PHOTO_MAX_BYTES = 5 * 1048576;
const today = (): string => new Date().toISOString().slice(0, 10);

/** Ordering checks: product (with a published library) → samples → cost and confirmation. */
@Component({
  selector: 'ohm-new-check-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, RouterLink, MatStepperModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule, MatRadioModule, Notice],
  templateUrl: './new-check-page.html',
  styleUrl: './new-check-page.scss',
})
export class NewCheckPage {
  private readonly fb = inject(NonNullableFormBuilder);
  private readonly orders = inject(OrdersData);
  private readonly drafts = inject(CheckDraftStore);
  private readonly router = inject(Router);
  private readonly notifier = inject(Notifier);
  protected readonly labels = MATRIX_LABELS;
  protected readonly today = today();
  protected readonly products = toSignal(inject(ProductsData).all().pipe(catchError(() => of(null))));
  protected readonly ready = computed(() => (this.products() ?? []).filter((p) => p.libraryState === 'published'));
  protected readonly notReady = computed(() => (this.products() ?? []).filter((p) => p.libraryState !== 'published'));
  protected readonly prices = signal<{ creditsPerCheckSample: number; available: number } | null>(null);
  protected readonly product = new FormControl('', { nonNullable: true, validators: Validators.required });
  protected readonly samples = new FormArray<ReturnType<NewCheckPage['sampleGroup']>>([]);
  protected readonly form = this.fb.group({ product: this.product, samples: this.samples });
  protected readonly count = toSignal(this.samples.valueChanges.pipe(startWith(null), takeUntilDestroyed()), { initialValue: null });
  protected readonly cost = computed(() => {
    this.count();
    return this.samples.length * (this.prices()?.creditsPerCheckSample ?? 0);
  });
  /** Set when the API refused the order for too few credits; the figure then follows the refreshed balance. */
  private readonly short = signal(false);
  protected readonly missing = computed(() => (this.short() ? Math.max(0, this.cost() - (this.prices()?.available ?? 0)) : 0));
  protected readonly problem = signal<ApiProblem | null>(null);
  protected readonly saving = signal(false);
  protected readonly photos = signal<ReadonlyMap<number, File>>(new Map());
  protected readonly photoError = signal<string | null>(null);
  protected readonly selected = computed<ProductSummary | null>(() => {
    this.count();
    return this.ready().find((p) => p.id === this.productId()) ?? null;
  });
  private readonly productId = toSignal(this.product.valueChanges.pipe(startWith(this.product.value)), { initialValue: '' });

  constructor() {
    const draft = this.drafts.load();
    const wanted = inject(ActivatedRoute).snapshot.queryParamMap.get('product');
    this.product.setValue(wanted ?? draft?.productId ?? '');
    for (const s of draft?.samples.length ? draft.samples : [null]) this.samples.push(this.sampleGroup(s));
    this.form.valueChanges.pipe(takeUntilDestroyed()).subscribe(() => this.drafts.save({ productId: this.product.value, samples: this.samples.getRawValue() }));
    this.loadPrices();
  }

  private loadPrices(): void {
    this.orders.prices().pipe(catchError(() => of(null))).subscribe((p) => this.prices.set(p));
  }

  private sampleGroup(s: DraftSample | null) {
    return this.fb.group({
      obtainedWhere: [s?.obtainedWhere ?? '', [Validators.required, Validators.maxLength(300)]],
      obtainedOn: [s?.obtainedOn ?? '', Validators.required],
      labelText: [s?.labelText ?? '', Validators.maxLength(2000)],
      lotClaimed: [s?.lotClaimed ?? '', Validators.maxLength(100)],
      container: [s?.container ?? '', Validators.maxLength(200)],
      notes: [s?.notes ?? '', Validators.maxLength(2000)],
    });
  }

  protected addSample(): void {
    this.samples.push(this.sampleGroup(null));
  }

  protected removeSample(i: number): void {
    this.samples.removeAt(i);
    const kept = new Map<number, File>();
    for (const [k, f] of this.photos()) if (k !== i) kept.set(k > i ? k - 1 : k, f);
    this.photos.set(kept);
  }

  protected pickPhoto(i: number, files: FileList | null): void {
    const file = files?.[0];
    this.photoError.set(null);
    if (!file) return;
    if (!['image/png', 'image/jpeg'].includes(file.type) || file.size > PHOTO_MAX_BYTES) {
      this.photoError.set(`${file.name}: a sample photo must be a PNG or JPEG image of at most 5 MB.`);
      return;
    }
    this.photos.set(new Map(this.photos()).set(i, file));
  }

  protected touchSamples(): void {
    this.samples.markAllAsTouched();
  }

  protected place(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.saving.set(true);
    this.problem.set(null);
    this.short.set(false);
    this.orders.placeCheck({ productId: this.product.value, samples: this.samples.getRawValue() }).subscribe({
      next: (order) => this.placed(order),
      error: (error: unknown) => {
        const problem = ApiProblem.from(error);
        this.saving.set(false);
        this.problem.set(problem);
        showFieldErrors(this.form, problem);
        this.short.set(problem.status === 409 && problem.title === 'Not enough credits');
        this.loadPrices();
      },
    });
  }

  private placed(order: OrderSummary): void {
    this.drafts.clear();
    const uploads = [...this.photos()].filter(([i]) => order.samples[i]);
    const done = () => {
      this.notifier.success(`Order placed: ${order.samples.map((s) => s.code).join(', ')}. Print the label pack next.`);
      void this.router.navigate(['/orders', order.id]);
    };
    if (!uploads.length) return done();
    // The placed order lists its samples in the order they were typed, so photo i belongs to sample i.
    from(uploads)
      .pipe(
        concatMap(([i, file]) => this.orders.addSamplePhoto(order.id, order.samples[i].id, file).pipe(catchError(() => of(null)))),
        last(),
      )
      .subscribe(done);
  }
}
