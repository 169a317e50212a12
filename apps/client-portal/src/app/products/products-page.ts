import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { MATRIX_LABELS, type ProductSummary } from '@ohmprint/contracts';
import { EmptyState, Notifier, SearchField, ServerList, Session, dialogResult } from '@ohmprint/ui';
import { libraryLook } from './library-state';
import { ProductDialog } from './product-dialog';
import { ProductPhoto } from './product-photo';
import { ProductsData } from './products-data';

@Component({
  selector: 'ohm-products-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RouterLink, MatTableModule, MatSortModule, MatPaginatorModule, MatProgressBarModule, MatButtonModule, MatIconModule, SearchField, EmptyState, ProductPhoto],
  template: `
    <header class="ohm-page-header">
      <div>
        <h1>Products</h1>
        <p>Each product gets its own reference library, built by the lab from authentic lots you send. Once a library is published, suspect samples of that product can be checked against it.</p>
      </div>
      <span class="ohm-spacer"></span>
      @if (isAdmin()) {
        <button mat-flat-button type="button" (click)="register()"><mat-icon>add</mat-icon>Register a product</button>
      }
    </header>
    <ohm-search-field label="Search by name or description" [initial]="list.state().q" (queryChange)="list.search($event)" />
    <div class="ohm-table-card">
      @if (list.loading()) { <mat-progress-bar mode="indeterminate" aria-label="Loading products" /> }
      <table mat-table [dataSource]="list.rows()" matSort [matSortActive]="list.state().sort" [matSortDirection]="list.state().dir" matSortDisableClear (matSortChange)="list.sortBy($event)" aria-label="Products">
        <ng-container matColumnDef="name">
          <th mat-header-cell *matHeaderCellDef mat-sort-header>Product</th>
          <td mat-cell *matCellDef="let p">
            <div class="product">
              @if (p.hasPhoto) { <ohm-product-photo [productId]="p.id" [name]="p.name" /> }
              <div><strong>{{ p.name }}</strong>@if (p.description) { <br /><span class="ohm-muted">{{ p.description }}</span> }</div>
            </div>
          </td>
        </ng-container>
        <ng-container matColumnDef="matrix">
          <th mat-header-cell *matHeaderCellDef mat-sort-header class="ohm-wide-only">Matrix</th>
          <td mat-cell *matCellDef="let p" class="ohm-wide-only">{{ matrixLabel(p) }}</td>
        </ng-container>
        <ng-container matColumnDef="library">
          <th mat-header-cell *matHeaderCellDef>Reference library</th>
          <td mat-cell *matCellDef="let p">
            <span class="ohm-status"><mat-icon aria-hidden="true">{{ look(p).icon }}</mat-icon>{{ look(p).label }}</span>
            <span class="hint ohm-muted">{{ look(p).hint }}</span>
          </td>
        </ng-container>
        <ng-container matColumnDef="actions">
          <th mat-header-cell *matHeaderCellDef><span class="cdk-visually-hidden">Actions</span></th>
          <td mat-cell *matCellDef="let p" class="actions">
            @if (isAdmin()) {
              @if (p.libraryState === 'published') {
                <a mat-flat-button [routerLink]="['/orders/new']" [queryParams]="{ product: p.id }"><mat-icon>add_shopping_cart</mat-icon>Order a check</a>
              }
              <a mat-stroked-button [routerLink]="['/products', p.id, 'enrol']"><mat-icon>inventory</mat-icon>Enrol lots</a>
              <button mat-icon-button type="button" [attr.aria-label]="'Edit ' + p.name" (click)="edit(p)"><mat-icon>edit</mat-icon></button>
            }
          </td>
        </ng-container>
        <tr mat-header-row *matHeaderRowDef="columns"></tr>
        <tr mat-row *matRowDef="let row; columns: columns"></tr>
      </table>
      @if (!list.loading() && list.rows().length === 0) {
        @if (list.searchText()) {
          <ohm-empty-state icon="search_off" heading="No product matches “{{ list.searchText() }}”"><p>Try part of the name, or clear the search.</p></ohm-empty-state>
        } @else {
          <ohm-empty-state icon="inventory_2" heading="No products yet">
            <p>Register the products you want protected, then send the lab a few authentic lots of each.</p>
            @if (isAdmin()) { <button mat-flat-button type="button" (click)="register()"><mat-icon>add</mat-icon>Register a product</button> }
          </ohm-empty-state>
        }
      }
      <mat-paginator [length]="list.total()" [pageIndex]="list.state().page - 1" [pageSize]="list.state().pageSize" [pageSizeOptions]="list.pageSizes" (page)="list.turn($event)" aria-label="Product pages" />
    </div>
  `,
  styles: `
    .product { display: flex; gap: 12px; align-items: center; padding: 8px 0; }
    .hint { display: block; font: var(--mat-sys-body-small); max-width: 40ch; }
    .actions { white-space: nowrap; text-align: end; }
    .actions > * { margin-left: 8px; }
    @media (max-width: 720px) { .actions { white-space: normal; } }
  `,
})
export class ProductsPage {
  private readonly data = inject(ProductsData);
  private readonly dialog = inject(MatDialog);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);
  protected readonly isAdmin = computed(() => this.session.hasAnyRole(['client-admin']));
  protected readonly columns = ['name', 'matrix', 'library', 'actions'];
  protected readonly list = new ServerList<ProductSummary>({
    sorts: ['name', 'matrix'],
    sort: 'name',
    dir: 'asc',
    pageSizes: [10, 20, 50],
    fetch: (query) => this.data.list(query),
  });

  protected look(p: ProductSummary): ReturnType<typeof libraryLook> {
    return libraryLook(p);
  }

  protected matrixLabel(p: ProductSummary): string {
    return MATRIX_LABELS[p.matrix];
  }

  protected register(): void {
    dialogResult<ProductDialog, ProductSummary>(this.dialog, ProductDialog).subscribe((p) => {
      this.notifier.success(`${p.name} registered. Enrol a few authentic lots next.`);
      this.list.reload();
    });
  }

  protected edit(product: ProductSummary): void {
    dialogResult<ProductDialog, ProductSummary, ProductSummary>(this.dialog, ProductDialog, product).subscribe((p) => {
      this.notifier.success(`${p.name} saved.`);
      this.list.reload();
    });
  }
}
