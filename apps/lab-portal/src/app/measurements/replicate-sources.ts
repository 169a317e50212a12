import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { Replicate } from '@ohmprint/contracts';
import { identityLook, readCode, readTemperature } from './replicate-source-text';

/**
 * What each replicate's file said about itself at upload — sample code, temperature, instrument,
 * date — and whether it matched, in plain view: the reviewer must not have to open anything.
 */
@Component({
  selector: 'ohm-replicate-sources',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `
    <table class="sources" [attr.aria-labelledby]="headingId()">
      <thead>
        <tr>
          <th scope="col">#</th><th scope="col">File</th><th scope="col">Sample named</th><th scope="col">Identity</th>
          <th scope="col">Temperature</th><th scope="col">Instrument (file)</th><th scope="col">Measured (file)</th>
        </tr>
      </thead>
      <tbody>
        @for (row of rows(); track row.r.id) {
          <tr [class.excluded]="row.r.excluded">
            <td>{{ row.r.replicateNumber }}</td>
            <td class="file">{{ row.r.fileName }}</td>
            <td>{{ row.code }}</td>
            <td>
              <span class="identity" [class]="'identity ' + row.look.tone">
                <mat-icon aria-hidden="true">{{ row.look.icon }}</mat-icon>{{ row.look.text }}
              </span>
            </td>
            <td>{{ row.temperature }}</td>
            <td>{{ row.r.declared?.instrument ? row.r.declared!.instrument!.text + ' (line ' + row.r.declared!.instrument!.line + ')' : '—' }}</td>
            <td>{{ row.r.declared?.measuredAt ? (row.r.declared!.measuredAt!.iso ?? row.r.declared!.measuredAt!.text) + ' (line ' + row.r.declared!.measuredAt!.line + ')' : '—' }}</td>
          </tr>
        }
      </tbody>
    </table>
  `,
  styles: `
    .sources { border-collapse: collapse; width: 100%; font: var(--mat-sys-body-small); }
    th { text-align: left; font: var(--mat-sys-label-medium); color: var(--mat-sys-on-surface-variant); padding: 4px 8px; border-bottom: 1px solid var(--mat-sys-outline-variant); }
    td { padding: 4px 8px; border-bottom: 1px solid var(--mat-sys-outline-variant); vertical-align: top; }
    .file { font-family: ui-monospace, monospace; overflow-wrap: anywhere; }
    .excluded td { color: var(--mat-sys-on-surface-variant); }
    .identity { display: inline-flex; align-items: center; gap: 4px; }
    .identity mat-icon { font-size: 18px; width: 18px; height: 18px; flex: none; }
    .identity.ok mat-icon { color: var(--mat-sys-primary); }
    .identity.warn { font-weight: 600; }
    .identity.warn mat-icon { color: var(--mat-sys-error); }
  `,
})
export class ReplicateSources {
  readonly replicates = input.required<readonly Replicate[]>();
  /** The heading that names this table, for assistive technology. */
  readonly headingId = input.required<string>();

  protected readonly rows = computed(() =>
    this.replicates().map((r) => ({ r, code: readCode(r), look: identityLook(r), temperature: readTemperature(r) })),
  );
}
