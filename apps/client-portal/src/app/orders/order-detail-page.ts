import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { MATRIX_LABELS, type OrderSummary } from '@ohmprint/contracts';
import { ApiProblem, FormSubmission, Notice, Notifier, SampleStateChip, ScreeningCaution, Session, confirmAction } from '@ohmprint/ui';
import { filter, switchMap } from 'rxjs';
import { CREDIT_STATE_LABELS, ORDER_STATUS_LOOK } from './order-status';
import { OrdersData } from './orders-data';
import { SampleTimeline } from './sample-timeline';

/** One order: each sample's way through the lab, shipping, cancelling and the label pack. */
@Component({
  selector: 'ohm-order-detail-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, ReactiveFormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatProgressBarModule, Notice,
    SampleStateChip, SampleTimeline, ScreeningCaution],
  templateUrl: './order-detail-page.html',
  styleUrl: './order-detail-page.scss',
})
export class OrderDetailPage {
  /** The order's id, from the route. */
  readonly id = input.required<string>();
  private readonly data = inject(OrdersData);
  private readonly dialog = inject(MatDialog);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);
  protected readonly isAdmin = computed(() => this.session.hasAnyRole(['client-admin']));
  protected readonly order = signal<OrderSummary | null>(null);
  protected readonly loadProblem = signal<ApiProblem | null>(null);
  protected readonly labels = MATRIX_LABELS;
  protected readonly creditLabels = CREDIT_STATE_LABELS;
  protected readonly downloading = signal(false);
  protected readonly status = computed(() => {
    const o = this.order();
    return o ? ORDER_STATUS_LOOK[o.status] : null;
  });
  protected readonly waiting = computed(() => this.order()?.status === 'placed');
  protected readonly shipment = inject(NonNullableFormBuilder).group({
    carrier: ['', [Validators.required, Validators.maxLength(100)]],
    trackingNumber: ['', Validators.maxLength(100)],
  });
  private readonly shipping = new FormSubmission(this.shipment);
  protected readonly shippingSaving = this.shipping.saving;
  protected readonly shippingProblem = this.shipping.problem;

  constructor() {
    effect(() => this.load(this.id()));
  }

  private load(id: string): void {
    this.data.order(id).subscribe({
      next: (o) => this.show(o),
      error: (e: unknown) => this.loadProblem.set(ApiProblem.from(e)),
    });
  }

  private show(o: OrderSummary): void {
    this.order.set(o);
    if (o.shipment) this.shipment.setValue({ carrier: o.shipment.carrier, trackingNumber: o.shipment.trackingNumber });
  }

  protected ship(): void {
    this.shipping.submit(
      () => this.data.ship(this.id(), this.shipment.getRawValue()),
      (o) => {
        this.shipping.saving.set(false);
        this.show(o);
        this.notifier.success('Shipment recorded. The lab will see it when the parcel arrives.');
      },
    );
  }

  protected cancel(): void {
    const o = this.order();
    if (!o) return;
    confirmAction(this.dialog, {
      title: 'Cancel this order?',
      message: `The ${o.samples.length} sample code${o.samples.length === 1 ? '' : 's'} stop being valid and the ${o.creditsReserved} credit${o.creditsReserved === 1 ? '' : 's'} held for it go back to your balance. Do not send the samples.`,
      confirmLabel: 'Cancel order',
      destructive: true,
    })
      .pipe(filter(Boolean), switchMap(() => this.data.cancel(o.id)))
      .subscribe((cancelled) => {
        this.show(cancelled);
        this.notifier.success('Order cancelled; its credits are back in your balance.');
      });
  }

  protected downloadLabels(): void {
    const o = this.order();
    if (!o) return;
    this.downloading.set(true);
    this.data.labelPack(o.id).subscribe({
      next: (blob) => {
        const url = URL.createObjectURL(blob);
        const a = document.createElement('a');
        a.href = url;
        a.download = `label-pack-${o.id.slice(0, 8).toUpperCase()}.pdf`;
        a.click();
        setTimeout(() => URL.revokeObjectURL(url), 10_000);
        this.downloading.set(false);
        this.notifier.success('Label pack downloaded. Print it, stick each label on its sample and sign the custody form.');
      },
      error: () => this.downloading.set(false),
    });
  }
}
