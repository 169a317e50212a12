import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

/** The caution every result screen and report carries, word for word. */
export const SCREENING_CAUTION =
  'An impedance fingerprint is a screening method: it tells whether a sample is consistent with the ' +
  "producer's reference library under the stated method. It does not prove origin or identity by itself; " +
  "a 'not consistent' result should be confirmed by an accredited confirmatory method before legal or " +
  'commercial action. Results relate only to the items tested.';

export const LOCAL_RULES_NOTE = 'Follow local regulations on how such results may be used.';

@Component({
  selector: 'ohm-screening-caution',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `<mat-icon aria-hidden="true">policy</mat-icon><p><strong>Screening method.</strong> {{ caution }} {{ localRules }}</p>`,
  styles: `
    :host { display: flex; gap: 10px; align-items: flex-start; padding: 10px 14px; border-radius: var(--mat-sys-corner-medium);
      background: var(--mat-sys-surface-container); color: var(--mat-sys-on-surface-variant); font: var(--mat-sys-body-small); }
    p { margin: 0; max-width: 110ch; }
    mat-icon { flex: none; color: var(--mat-sys-on-surface-variant); }
  `,
})
export class ScreeningCaution {
  protected readonly caution = SCREENING_CAUTION;
  protected readonly localRules = LOCAL_RULES_NOTE;
}
