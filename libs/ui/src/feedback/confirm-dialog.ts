import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialog, MatDialogModule } from '@angular/material/dialog';
import { map, type Observable } from 'rxjs';

export interface ConfirmOptions {
  readonly title: string;
  readonly message: string;
  readonly confirmLabel: string;
  /** Uses the error colour on the confirm button (the words still say what happens). */
  readonly destructive?: boolean;
}

@Component({
  selector: 'ohm-confirm-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatDialogModule, MatButtonModule],
  template: `
    <h2 mat-dialog-title>{{ data.title }}</h2>
    <mat-dialog-content><p>{{ data.message }}</p></mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" [mat-dialog-close]="false">Cancel</button>
      <button mat-flat-button type="button" [class.ohm-destructive]="data.destructive" [mat-dialog-close]="true" cdkFocusInitial>
        {{ data.confirmLabel }}
      </button>
    </mat-dialog-actions>
  `,
  styles: `
    p {
      max-width: 48ch;
    }
  `,
})
export class ConfirmDialog {
  protected readonly data = inject<ConfirmOptions>(MAT_DIALOG_DATA);
}

/** Opens the confirmation and emits once: true when the user confirmed. */
export function confirmAction(dialog: MatDialog, options: ConfirmOptions): Observable<boolean> {
  return dialog
    .open<ConfirmDialog, ConfirmOptions, boolean>(ConfirmDialog, { data: options, autoFocus: 'dialog' })
    .afterClosed()
    .pipe(map((confirmed) => confirmed === true));
}
