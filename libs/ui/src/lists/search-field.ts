import { ChangeDetectionStrategy, Component, effect, input, output } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { debounceTime, filter, map } from 'rxjs';

/** The search box above every list; emits the text once typing pauses. */
@Component({
  selector: 'ohm-search-field',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule, MatIconModule, MatButtonModule],
  template: `
    <mat-form-field class="field">
      <mat-label>{{ label() }}</mat-label>
      <mat-icon matPrefix aria-hidden="true">search</mat-icon>
      <input matInput type="search" [formControl]="text" autocomplete="off" />
      @if (text.value) {
        <button mat-icon-button matSuffix type="button" aria-label="Clear search" (click)="text.setValue('')">
          <mat-icon>close</mat-icon>
        </button>
      }
    </mat-form-field>
  `,
  styles: `
    :host {
      display: block;
    }
    .field {
      width: min(360px, 100%);
    }
  `,
})
export class SearchField {
  readonly label = input('Search');
  /**
   * The search the list holds (restored from the URL, or changed by Back): shown without emitting.
   * Text the field itself emitted is not written back, so typing on while the list catches up
   * loses nothing.
   */
  readonly initial = input('');
  readonly queryChange = output<string>();
  protected readonly text = new FormControl('', { nonNullable: true });
  private last = '';

  constructor() {
    this.text.valueChanges
      .pipe(
        debounceTime(300),
        map((value) => value.trim()),
        filter((value) => value !== this.last),
        takeUntilDestroyed(),
      )
      .subscribe((value) => {
        this.last = value;
        this.queryChange.emit(value);
      });
    effect(() => {
      const held = this.initial().trim();
      if (held === this.last) return;
      this.last = held;
      this.text.setValue(held, { emitEvent: false });
    });
  }
}
