import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';

/** Choose or drop photos of the parcel; each shows a preview before it is uploaded. */
@Component({
  selector: 'ohm-photo-picker',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatIconModule],
  template: `
    <div class="drop" role="group" aria-label="Photos of the parcel" (dragover)="$event.preventDefault()" (drop)="dropped($event)">
      <mat-icon aria-hidden="true">photo_camera</mat-icon>
      <span>Drop photos here or</span>
      <label class="pick">
        <input type="file" accept="image/*" multiple (change)="picked($event)" />
        <span mat-stroked-button>choose photos</span>
      </label>
    </div>
    @if (previews().length > 0) {
      <ul class="previews">
        @for (p of previews(); track p.url) {
          <li>
            <img [src]="p.url" [alt]="'Preview of ' + p.name" />
            <button mat-icon-button type="button" [attr.aria-label]="'Remove ' + p.name" (click)="remove(p.index)"><mat-icon>close</mat-icon></button>
          </li>
        }
      </ul>
    }
  `,
  styles: `
    .drop { display: flex; align-items: center; gap: 8px; padding: 12px; border: 1px dashed var(--mat-sys-outline);
      border-radius: var(--mat-sys-corner-medium); color: var(--mat-sys-on-surface-variant); }
    .pick input { position: absolute; width: 1px; height: 1px; opacity: 0; }
    .pick span { cursor: pointer; text-decoration: underline; color: var(--mat-sys-primary); }
    .pick:focus-within span { outline: 2px solid var(--mat-sys-primary); }
    .previews { display: flex; flex-wrap: wrap; gap: 8px; list-style: none; padding: 0; margin: 8px 0 0; }
    li { position: relative; }
    img { width: 96px; height: 72px; object-fit: cover; border-radius: var(--mat-sys-corner-small); display: block; }
    li button { position: absolute; top: -8px; right: -8px; background: var(--mat-sys-surface); transform: scale(0.8); }
  `,
})
export class PhotoPicker {
  readonly files = input.required<readonly File[]>();
  readonly filesChange = output<File[]>();
  private readonly urls = new Map<File, string>();

  constructor() {
    inject(DestroyRef).onDestroy(() => this.urls.forEach((u) => URL.revokeObjectURL(u)));
  }

  protected readonly previews = computed(() =>
    this.files().map((f, index) => {
      let url = this.urls.get(f);
      if (!url) {
        url = URL.createObjectURL(f);
        this.urls.set(f, url);
      }
      return { url, name: f.name, index };
    }),
  );

  protected picked(event: Event): void {
    const input = event.target as HTMLInputElement;
    this.add(Array.from(input.files ?? []));
    input.value = '';
  }

  protected dropped(event: DragEvent): void {
    event.preventDefault();
    this.add(Array.from(event.dataTransfer?.files ?? []).filter((f) => f.type.startsWith('image/')));
  }

  protected remove(index: number): void {
    this.filesChange.emit(this.files().filter((_, i) => i !== index));
  }

  private add(more: File[]): void {
    if (more.length > 0) this.filesChange.emit([...this.files(), ...more]);
  }
}
