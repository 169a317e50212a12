import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { VerdictChip } from '@ohmprint/ui';
import { catchError, of } from 'rxjs';
import { ClientReportsData } from './client-reports-data';
import { reportStanding } from './report-standing';

/** Home-page card: the newest reports with their verdict and a download. */
@Component({
  selector: 'ohm-latest-reports',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, RouterLink, MatButtonModule, MatIconModule, VerdictChip],
  template: `
    <h3>Latest reports</h3>
    @if (reports(); as page) {
      @if (page.items.length === 0) {
        <p class="ohm-muted">No report yet.</p>
      } @else {
        <ul>
          @for (r of page.items; track r.id) {
            <li>
              <code [class.withdrawn]="r.status !== 'issued'">{{ r.number }}</code>
              <span>{{ r.productName }} · {{ r.issuedAt | date: 'd MMM y' }}</span>
              @if (standing(r); as st) {
                <span class="ohm-status ohm-warning"><mat-icon aria-hidden="true">{{ st.icon }}</mat-icon>{{ st.label }}</span>
                <button mat-icon-button type="button" [attr.aria-label]="'Download ' + r.number + ' (' + st.label + ')'" (click)="data.download(r)"><mat-icon>download</mat-icon></button>
              } @else {
                <ohm-verdict-chip [verdict]="r.verdict" [compact]="true" />
                <button mat-icon-button type="button" [attr.aria-label]="'Download ' + r.number" (click)="data.download(r)"><mat-icon>download</mat-icon></button>
              }
            </li>
          }
        </ul>
      }
      <a mat-button routerLink="/reports">All reports</a>
    }
  `,
  styles: `
    h3 { font: var(--mat-sys-title-medium); margin: 0 0 8px; }
    ul { list-style: none; padding: 0; margin: 0 0 8px; display: flex; flex-direction: column; gap: 6px; }
    li { display: flex; flex-wrap: wrap; gap: 4px 12px; align-items: center; }
    .withdrawn { text-decoration: line-through; }
  `,
})
export class LatestReports {
  protected readonly data = inject(ClientReportsData);
  protected readonly reports = toSignal(this.data.latest(5).pipe(catchError(() => of(null))));
  protected readonly standing = reportStanding;
}
