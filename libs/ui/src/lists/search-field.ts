import { ChangeDetectionStrategy, Component, input, output, type OnInit } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { debounceTime, distinctUntilChanged } from 'rxjs';

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
export class SearchField implements OnInit {
  readonly label = input('Search');
  /** Text to start with (a search restored from the URL); shown without emitting. */
  readonly initial = input('');
  readonly queryChange = output<string>();
  protected readonly text = new FormControl('', { nonNullable: true });

  constructor() {
    this.text.valueChanges
      .pipe(debounceTime(300), distinctUntilChanged(), takeUntilDestroyed())
      .subscribe((value) => this.queryChange.emit(value));
  }

  ngOnInit(): void {
    if (this.initial()) this.text.setValue(this.initial(), { emitEvent: false });
  }
}
