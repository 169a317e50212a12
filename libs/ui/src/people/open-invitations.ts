import type { ComponentType } from '@angular/cdk/portal';
import { inject, signal } from '@angular/core';
import { MatDialog } from '@angular/material/dialog';
import type { Invitation, Page } from '@ohmprint/contracts';
import { tap, type Observable } from 'rxjs';
import { Notifier } from '../errors/notifier';
import { dialogResult } from '../feedback/dialog-result';

/**
 * The invitations of a people page that nobody has accepted yet, and the invite flow that adds
 * to them. Create it in a field initialiser (it injects the dialog and the snack bar).
 */
export class OpenInvitations {
  readonly items = signal<readonly Invitation[]>([]);
  readonly total = signal(0);
  private readonly dialog = inject(MatDialog);
  private readonly notifier = inject(Notifier);

  constructor(private readonly load: () => Observable<Page<Invitation>>) {}

  reload(): void {
    this.load().subscribe((page) => {
      this.items.set(page.items);
      this.total.set(page.total);
    });
  }

  /** Opens the page's invite dialog; a sent invitation is announced and listed here, then emitted. */
  invite(dialogComponent: ComponentType<unknown>): Observable<Invitation> {
    return dialogResult<unknown, Invitation>(this.dialog, dialogComponent).pipe(
      tap((invitation) => {
        this.notifier.success(`Invitation sent to ${invitation.email}.`);
        this.reload();
      }),
    );
  }
}
