import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, DestroyRef, effect, inject, input, signal } from '@angular/core';
import { MAT_DIALOG_DATA, MatDialog, MatDialogModule } from '@angular/material/dialog';
import { MatButtonModule } from '@angular/material/button';
import type { IntakePhoto } from '@ohmprint/contracts';
import { IntakeData } from './intake-data';

interface Shown {
  photo: IntakePhoto;
  url: string;
}

/** The parcel photos taken at intake, as thumbnails; one opens full size. */
@Component({
  selector: 'ohm-intake-photos',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (photos().length === 0) {
      <span class="ohm-muted">None</span>
    } @else {
      <ul class="thumbs" aria-label="Intake photos">
        @for (p of photos(); track p.id) {
          <li>
            @if (urls()[p.id]; as url) {
              <button type="button" class="thumb" [attr.aria-label]="'Open photo ' + p.fileName" (click)="open({ photo: p, url })">
                <img [src]="url" [alt]="'Intake photo ' + p.fileName" />
              </button>
            } @else {
              <span class="thumb loading-slot" [attr.aria-label]="'Loading photo ' + p.fileName"></span>
            }
          </li>
        }
      </ul>
    }
  `,
  styles: `
    .thumbs { display: flex; flex-wrap: wrap; gap: 6px; list-style: none; padding: 0; margin: 0; }
    .thumb { display: block; padding: 0; border: 1px solid var(--mat-sys-outline-variant); border-radius: var(--mat-sys-corner-small);
      background: var(--mat-sys-surface-container); cursor: zoom-in; overflow: hidden; }
    .thumb:focus-visible { outline: 2px solid var(--mat-sys-primary); outline-offset: 2px; }
    .thumb img, .loading-slot { width: 72px; height: 54px; object-fit: cover; display: block; }
  `,
})
export class IntakePhotos {
  private readonly data = inject(IntakeData);
  private readonly dialog = inject(MatDialog);
  readonly sampleId = input.required<string>();
  readonly photos = input.required<readonly IntakePhoto[]>();
  protected readonly urls = signal<Record<string, string>>({});
  private readonly requested = new Set<string>();

  constructor() {
    inject(DestroyRef).onDestroy(() => Object.values(this.urls()).forEach((u) => URL.revokeObjectURL(u)));
    effect(() => {
      const sampleId = this.sampleId();
      for (const p of this.photos()) {
        if (this.requested.has(p.id)) continue;
        this.requested.add(p.id);
        this.data.photo(sampleId, p.id).subscribe((blob) => this.urls.update((m) => ({ ...m, [p.id]: URL.createObjectURL(blob) })));
      }
    });
  }

  protected open(shown: Shown): void {
    this.dialog.open(PhotoViewerDialog, { data: shown, maxWidth: '92vw', autoFocus: 'dialog' });
  }
}

@Component({
  selector: 'ohm-photo-viewer-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatDialogModule, MatButtonModule],
  template: `
    <h2 mat-dialog-title>{{ shown.photo.fileName }}</h2>
    <mat-dialog-content>
      <img [src]="shown.url" [alt]="'Intake photo ' + shown.photo.fileName" />
      <p class="ohm-muted">Taken in by {{ shown.photo.uploadedBy.displayName }}, {{ shown.photo.uploadedAt | date: 'd MMM y, HH:mm' }}</p>
    </mat-dialog-content>
    <mat-dialog-actions align="end"><button mat-button mat-dialog-close>Close</button></mat-dialog-actions>
  `,
  styles: `img { display: block; max-width: 100%; max-height: 70vh; margin: 0 auto; }`,
})
export class PhotoViewerDialog {
  protected readonly shown = inject<Shown>(MAT_DIALOG_DATA);
}
