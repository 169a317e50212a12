import { ChangeDetectionStrategy, Component, DestroyRef, effect, inject, input, signal } from '@angular/core';
import { ProductsData } from './products-data';

/** A product's label photo, fetched with the sign-in token (an <img src> would not carry it). */
@Component({
  selector: 'ohm-product-photo',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `@if (url(); as u) { <img [src]="u" [alt]="'Label of ' + name()" /> }`,
  styles: `
    :host { display: inline-block; width: 56px; height: 56px; border-radius: var(--mat-sys-corner-small); overflow: hidden;
      background: var(--mat-sys-surface-container); }
    img { width: 100%; height: 100%; object-fit: cover; }
  `,
})
export class ProductPhoto {
  readonly productId = input.required<string>();
  readonly name = input.required<string>();
  protected readonly url = signal<string | null>(null);
  private readonly data = inject(ProductsData);

  constructor() {
    effect((onCleanup) => {
      const sub = this.data.photo(this.productId()).subscribe({ next: (blob) => this.url.set(URL.createObjectURL(blob)), error: () => this.url.set(null) });
      onCleanup(() => sub.unsubscribe());
    });
    inject(DestroyRef).onDestroy(() => {
      const u = this.url();
      if (u) URL.revokeObjectURL(u);
    });
  }
}
