import type { ComponentType } from '@angular/cdk/portal';
import type { MatDialog } from '@angular/material/dialog';
import { filter, type Observable } from 'rxjs';

/** Opens a dialog and emits what it closed with; closing without an answer (Cancel, Escape) emits nothing. */
export function dialogResult<C, R, D = void>(dialog: MatDialog, component: ComponentType<C>, data?: D): Observable<R> {
  return dialog
    .open<C, D, R>(component, data === undefined ? undefined : { data })
    .afterClosed()
    .pipe(filter((result): result is R => !!result));
}
