import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { ReactiveFormsModule, type FormControl } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';

/** The e-mail address an invitation goes to, with the messages every invite form shows. */
@Component({
  selector: 'ohm-invitee-email-field',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule],
  template: `
    <mat-form-field>
      <mat-label>E-mail</mat-label>
      <input matInput type="email" [formControl]="control()" required [attr.cdkFocusInitial]="focusFirst() ? '' : null" />
      @if (control().hasError('required')) {
        <mat-error>{{ requiredMessage() }}</mat-error>
      } @else if (control().hasError('email')) {
        <mat-error>That doesn't look like an e-mail address.</mat-error>
      } @else if (control().hasError('server')) {
        <mat-error>E-mail {{ control().getError('server') }}.</mat-error>
      }
    </mat-form-field>
  `,
  styles: `
    :host {
      display: contents;
    }
  `,
})
export class InviteeEmailField {
  readonly control = input.required<FormControl<string>>();
  readonly requiredMessage = input('Enter their e-mail address.');
  /** Whether the dialog opens with the cursor here. */
  readonly focusFirst = input(false);
}
