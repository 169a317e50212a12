import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatSelectModule } from '@angular/material/select';
import { Router, RouterLink } from '@angular/router';
import { MATRIX_LABELS, type LibraryProduct, type MethodItem } from '@ohmprint/contracts';
import { Notifier, SearchField, ServerList, Session } from '@ohmprint/ui';
import { LibrariesData } from './libraries-data';

const STATUS_ICON: Record<string, string> = { draft: 'edit_note', published: 'verified', retired: 'archive' };

/** Every product with its measured reference lots and library versions; analysts start drafts here. */
@Component({
  selector: 'ohm-libraries-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [FormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatPaginatorModule, MatSelectModule, SearchField],
  styles: `
    table { border-collapse: collapse; width: 100%; }
    th, td { text-align: left; padding: .5rem; border-bottom: 1px solid var(--mat-sys-outline-variant); vertical-align: top; }
    .versions a { display: inline-flex; align-items: center; gap: .25rem; margin-right: .75rem; }
    .versions mat-icon { font-size: 18px; width: 18px; height: 18px; }
    .start { display: flex; gap: .5rem; align-items: center; flex-wrap: wrap; }
    .start mat-form-field { width: 16rem; }
  `,
  template: `
    <header class="ohm-page-header">
      <div>
        <h1>Reference libraries</h1>
        <p>Build a product’s library from its measured reference lots: start a draft under a method version, review each lot, calibrate, then a reviewer or lab admin publishes it.</p>
      </div>
    </header>
    <ohm-search-field label="Search products or producers" [initial]="list.state().q" (queryChange)="list.search($event)" />
    <div class="ohm-table-card">
      <table aria-label="Products and their libraries">
        <thead><tr><th scope="col">Product</th><th scope="col">Producer</th><th scope="col">Measured reference lots</th><th scope="col">Library versions</th>
          @if (canBuild()) { <th scope="col">Start a draft</th> }</tr></thead>
        <tbody>
          @for (p of list.rows(); track p.productId) {
            <tr>
              <td>{{ p.name }} <small>({{ matrixLabel[p.matrix] }})</small></td>
              <td>{{ p.clientName }}</td>
              <td>{{ p.measuredLots }}</td>
              <td class="versions">
                @for (v of p.versions; track v.id) {
                  <a [routerLink]="['/libraries/versions', v.id]"><mat-icon aria-hidden="true">{{ statusIcon[v.status] }}</mat-icon>v{{ v.version }} {{ v.supersededBy ? 'superseded' : v.status }} · {{ v.lotCount }} lots</a>
                } @empty { <span>none yet</span> }
              </td>
              @if (canBuild()) {
                <td>
                  <div class="start">
                    <mat-form-field subscriptSizing="dynamic">
                      <mat-label>Method version</mat-label>
                      <mat-select [(ngModel)]="choice[p.productId]">
                        @for (m of methodsFor(p); track m.id) { @for (v of m.versions; track v.id) { <mat-option [value]="v.id">{{ m.name }} v{{ v.version }}</mat-option> } }
                      </mat-select>
                    </mat-form-field>
                    <button mat-stroked-button type="button" [disabled]="!choice[p.productId] || !p.measuredLots" (click)="start(p)">Start draft</button>
                  </div>
                </td>
              }
            </tr>
          } @empty {
            <tr><td colspan="5">No products match. Producers register products in the client portal.</td></tr>
          }
        </tbody>
      </table>
      <mat-paginator [length]="list.total()" [pageSize]="list.state().pageSize" [pageIndex]="list.state().page - 1" [pageSizeOptions]="list.pageSizes" (page)="list.turn($event)" aria-label="Pages of products" />
    </div>
  `,
})
export class LibrariesPage {
  protected readonly matrixLabel = MATRIX_LABELS;
  private readonly data = inject(LibrariesData);
  private readonly router = inject(Router);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);
  protected readonly statusIcon = STATUS_ICON;
  protected readonly canBuild = computed(() => this.session.hasAnyRole(['analyst']));
  protected readonly list = new ServerList<LibraryProduct>({
    sorts: ['name'],
    sort: 'name',
    dir: 'asc',
    pageSizes: [10, 20, 50],
    fetch: (query) => this.data.products(query.page, query.pageSize, query.q),
  });
  protected readonly methods = signal<MethodItem[]>([]);
  protected readonly choice: Record<string, string> = {};

  constructor() {
    this.data.methods().subscribe((m) => this.methods.set(m.items));
  }

  protected methodsFor(p: LibraryProduct): MethodItem[] {
    return this.methods().filter((m) => m.matrix === p.matrix);
  }

  protected start(p: LibraryProduct): void {
    this.data.startDraft(p.productId, this.choice[p.productId]).subscribe((d) => {
      const skipped = d.skipped.length ? ` ${d.skipped.length} sample(s) could not become lots.` : '';
      this.notifier.success(`Draft version ${d.version} of ${p.name} holds ${d.lotCount} lots.${skipped}`);
      void this.router.navigate(['/libraries/versions', d.id]);
    });
  }
}
