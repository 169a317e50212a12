import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatTableModule } from '@angular/material/table';
import { formatMoney, type CreditPack } from '@ohmprint/contracts';
import { EmptyState, FormSubmission, Notice, Notifier, confirmAction, dialogResult } from '@ohmprint/ui';
import { filter, switchMap } from 'rxjs';
import { BillingData } from './billing-data';
import { BillingTabs } from './billing-tabs';
import { PackDialog } from './pack-dialog';

@Component({
  selector: 'ohm-prices-packs-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatTableModule, MatButtonModule, MatIconModule, MatFormFieldModule, MatInputModule, EmptyState, Notice, BillingTabs],
  template: `
    <header class="ohm-page-header">
      <div>
        <h1>Billing</h1>
        <p>What a check costs in credits, and the credit packs clients buy through the payment service.</p>
      </div>
    </header>
    <ohm-billing-tabs>
      <section aria-labelledby="prices-heading" class="block">
        <h2 id="prices-heading">Prices in credits</h2>
        <form [formGroup]="prices" (ngSubmit)="savePrices()" novalidate class="prices">
          @if (pricesProblem(); as p) {
            <ohm-notice tone="error" icon="error">{{ p.summary }}</ohm-notice>
          }
          <mat-form-field>
            <mat-label>Credits per check sample</mat-label>
            <input matInput type="number" formControlName="creditsPerCheckSample" min="1" max="1000" step="1" required />
            @if (prices.controls.creditsPerCheckSample.invalid) { <mat-error>A whole number from 1 to 1000.</mat-error> }
          </mat-form-field>
          <mat-form-field>
            <mat-label>Credits per reference lot</mat-label>
            <input matInput type="number" formControlName="creditsPerReferenceLot" min="1" max="1000" step="1" required />
            @if (prices.controls.creditsPerReferenceLot.invalid) { <mat-error>A whole number from 1 to 1000.</mat-error> }
          </mat-form-field>
          <button mat-flat-button type="submit" [disabled]="pricesSaving()">Save prices</button>
        </form>
        <p class="ohm-muted">New orders use these prices; orders already placed keep what they reserved.</p>
      </section>

      <section aria-labelledby="packs-heading" class="block">
        <div class="heading-row">
          <h2 id="packs-heading">Credit packs</h2>
          <span class="ohm-spacer"></span>
          <button mat-flat-button type="button" (click)="newPack()"><mat-icon>add</mat-icon>New pack</button>
        </div>
        @if (packs(); as list) {
          @if (list.length === 0) {
            <ohm-empty-state icon="sell" heading="No credit packs yet">
              <p>Clients buy credits in packs. Put the first one on sale.</p>
            </ohm-empty-state>
          } @else {
            <div class="ohm-table-card">
              <table mat-table [dataSource]="list" aria-label="Credit packs">
                <ng-container matColumnDef="name">
                  <th mat-header-cell *matHeaderCellDef>Pack</th>
                  <td mat-cell *matCellDef="let p">{{ p.name }}</td>
                </ng-container>
                <ng-container matColumnDef="credits">
                  <th mat-header-cell *matHeaderCellDef>Credits</th>
                  <td mat-cell *matCellDef="let p">{{ p.credits }}</td>
                </ng-container>
                <ng-container matColumnDef="price">
                  <th mat-header-cell *matHeaderCellDef>Price</th>
                  <td mat-cell *matCellDef="let p">{{ money(p) }}</td>
                </ng-container>
                <ng-container matColumnDef="state">
                  <th mat-header-cell *matHeaderCellDef>State</th>
                  <td mat-cell *matCellDef="let p">
                    <span class="ohm-status"><mat-icon aria-hidden="true">{{ p.active ? 'storefront' : 'inventory' }}</mat-icon>{{ p.active ? 'On sale' : 'Retired' }}</span>
                  </td>
                </ng-container>
                <ng-container matColumnDef="priceId">
                  <th mat-header-cell class="ohm-wide-only" *matHeaderCellDef>Payment-service price</th>
                  <td mat-cell class="ohm-wide-only" *matCellDef="let p"><code>{{ p.paymentPriceId ?? 'made at first sale' }}</code></td>
                </ng-container>
                <ng-container matColumnDef="actions">
                  <th mat-header-cell *matHeaderCellDef><span class="cdk-visually-hidden">Actions</span></th>
                  <td mat-cell *matCellDef="let p" class="actions">
                    <button mat-button type="button" (click)="edit(p)" [attr.aria-label]="'Edit ' + p.name">Edit</button>
                    <button mat-button type="button" (click)="toggle(p)" [attr.aria-label]="(p.active ? 'Retire ' : 'Put on sale again: ') + p.name">{{ p.active ? 'Retire' : 'Put on sale' }}</button>
                  </td>
                </ng-container>
                <tr mat-header-row *matHeaderRowDef="columns"></tr>
                <tr mat-row *matRowDef="let row; columns: columns" [class.retired]="!row.active"></tr>
              </table>
            </div>
          }
        }
      </section>
    </ohm-billing-tabs>
  `,
  styles: `
    .block { margin-bottom: 24px; }
    h2 { font: var(--mat-sys-title-medium); margin: 0 0 8px; }
    .prices { display: flex; flex-wrap: wrap; gap: 4px 12px; align-items: baseline; }
    .heading-row { display: flex; align-items: center; margin-bottom: 8px; }
    .actions { white-space: nowrap; text-align: right; }
    tr.retired td { color: var(--mat-sys-on-surface-variant); }
  `,
})
export class PricesPacksPage {
  private readonly data = inject(BillingData);
  private readonly dialog = inject(MatDialog);
  private readonly notifier = inject(Notifier);
  private readonly fb = inject(NonNullableFormBuilder);
  protected readonly columns = ['name', 'credits', 'price', 'state', 'priceId', 'actions'];
  protected readonly packs = signal<CreditPack[] | null>(null);
  protected readonly prices = this.fb.group({
    creditsPerCheckSample: [1, [Validators.required, Validators.min(1), Validators.max(1000), Validators.pattern(/^\d+$/)]],
    creditsPerReferenceLot: [1, [Validators.required, Validators.min(1), Validators.max(1000), Validators.pattern(/^\d+$/)]],
  });
  private readonly pricesSubmission = new FormSubmission(this.prices);
  protected readonly pricesSaving = this.pricesSubmission.saving;
  protected readonly pricesProblem = this.pricesSubmission.problem;

  constructor() {
    this.data.prices().subscribe((p) => this.prices.reset(p));
    this.loadPacks();
  }

  protected money(p: CreditPack): string {
    return formatMoney(p.price, p.currency);
  }

  private loadPacks(): void {
    this.data.packs().subscribe((list) => this.packs.set(list));
  }

  protected savePrices(): void {
    const v = this.prices.getRawValue();
    this.pricesSubmission.submit(
      () => this.data.savePrices({ creditsPerCheckSample: Number(v.creditsPerCheckSample), creditsPerReferenceLot: Number(v.creditsPerReferenceLot) }),
      (saved) => {
        this.prices.reset(saved);
        this.notifier.success('Prices saved. New orders use them.');
      },
    );
  }

  protected newPack(): void {
    dialogResult<PackDialog, CreditPack>(this.dialog, PackDialog).subscribe((p) => {
      this.notifier.success(`${p.name} is on sale.`);
      this.loadPacks();
    });
  }

  protected edit(pack: CreditPack): void {
    dialogResult<PackDialog, CreditPack, CreditPack>(this.dialog, PackDialog, pack).subscribe((p) => {
      this.notifier.success(`${p.name} was saved.`);
      this.loadPacks();
    });
  }

  protected toggle(pack: CreditPack): void {
    const retiring = pack.active;
    confirmAction(this.dialog, {
      title: retiring ? `Retire ${pack.name}?` : `Put ${pack.name} on sale again?`,
      message: retiring
        ? 'Clients can no longer buy this pack. Payments already made stay as they are, and you can put it on sale again later.'
        : 'Clients can buy this pack again at its current price.',
      confirmLabel: retiring ? 'Retire pack' : 'Put on sale',
      destructive: retiring,
    }).pipe(
      filter(Boolean),
      switchMap(() => this.data.updatePack(pack.id, { active: !retiring }, false)),
    ).subscribe((p) => {
      this.notifier.success(retiring ? `${p.name} was retired.` : `${p.name} is on sale again.`);
      this.loadPacks();
    });
  }
}
