import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { type FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { LAB_ROLES, type LabRole } from '@ohmprint/contracts';
import { ROLE_LABELS } from '@ohmprint/ui';
import { map, startWith, switchMap } from 'rxjs';

const ROLE_HINTS: Record<LabRole, string> = {
  'lab-admin': 'Lab profile, methods, prices, staff and clients',
  'intake-technician': 'Receives shipments and keeps chain of custody',
  analyst: 'Uploads measurements and runs analyses',
  reviewer: 'Approves analyses and issues reports (never their own)',
};

/** Check boxes for a staff member's lab roles, bound to one FormControl<LabRole[]>. */
@Component({
  selector: 'ohm-roles-picker',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatCheckboxModule],
  template: `
    <fieldset>
      <legend>Roles</legend>
      @for (role of roles; track role) {
        <mat-checkbox [checked]="state().value.includes(role)" (change)="toggle(role, $event.checked)">
          <span class="label">{{ labels[role] }}</span>
          <span class="hint">{{ hints[role] }}</span>
        </mat-checkbox>
      }
      @if (state().touched && state().missing) {
        <p class="error" role="alert">Pick at least one role.</p>
      } @else if (state().server; as message) {
        <p class="error" role="alert">Roles {{ message }}.</p>
      }
    </fieldset>
  `,
  styles: `
    fieldset {
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: var(--mat-sys-corner-small);
      padding: 8px 12px;
      margin: 0;
      display: flex;
      flex-direction: column;
    }
    legend {
      font: var(--mat-sys-label-large);
      padding: 0 4px;
    }
    .label {
      display: block;
    }
    .hint {
      display: block;
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
    .error {
      margin: 4px 0 0;
      color: var(--mat-sys-error);
      font: var(--mat-sys-body-small);
    }
  `,
})
export class RolesPicker {
  readonly control = input.required<FormControl<LabRole[]>>();
  protected readonly roles = LAB_ROLES;
  protected readonly labels = ROLE_LABELS;
  protected readonly hints = ROLE_HINTS;
  /** The control's state as a signal, so marking it touched from the form re-renders this view. */
  protected readonly state = toSignal(
    toObservable(this.control).pipe(
      switchMap((c) =>
        c.events.pipe(
          startWith(null),
          map(() => ({ value: c.value, touched: c.touched, missing: c.hasError('required'), server: c.getError('server') as string | undefined })),
        ),
      ),
    ),
    { initialValue: { value: [] as LabRole[], touched: false, missing: false, server: undefined } },
  );

  protected toggle(role: LabRole, checked: boolean): void {
    const control = this.control();
    const next = checked ? [...control.value, role] : control.value.filter((r) => r !== role);
    control.setValue(LAB_ROLES.filter((r) => next.includes(r)));
    control.markAsDirty();
    control.markAsTouched();
  }
}
