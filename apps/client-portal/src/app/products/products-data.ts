import { HttpClient, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { ProductPageSchema, ProductSummarySchema, type ListQuery, type ProductInput, type ProductPage, type ProductSummary } from '@ohmprint/contracts';
import { queryParams } from '@ohmprint/ui';
import { map, type Observable } from 'rxjs';

/** The organisation's products; a client admin registers and edits them. */
@Injectable({ providedIn: 'root' })
export class ProductsData {
  private readonly http = inject(HttpClient);

  list(query: ListQuery): Observable<ProductPage> {
    return this.http.get('/api/client/products', { params: queryParams(query) }).pipe(map((r) => ProductPageSchema.parse(r)));
  }

  /** Every product (up to 100), by name: enough for the pickers of the order forms. */
  all(): Observable<ProductSummary[]> {
    const params = new HttpParams().set('sort', 'name').set('dir', 'asc').set('page', 1).set('pageSize', 100);
    return this.http.get('/api/client/products', { params }).pipe(map((r) => ProductPageSchema.parse(r).items));
  }

  save(id: string | null, input: ProductInput, photo: File | null): Observable<ProductSummary> {
    const form = new FormData();
    form.append('name', input.name);
    form.append('matrix', input.matrix);
    form.append('description', input.description);
    if (photo) form.append('photo', photo, photo.name);
    const request = id ? this.http.put(`/api/client/products/${id}`, form) : this.http.post('/api/client/products', form);
    return request.pipe(map((r) => ProductSummarySchema.parse(r)));
  }

  photo(id: string): Observable<Blob> {
    return this.http.get(`/api/client/products/${id}/photo`, { responseType: 'blob' });
  }
}
