import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatTabsModule } from '@angular/material/tabs';
import { RouterLink, RouterLinkActive } from '@angular/router';

/** The three credit pages as tabs: balance and packs, ledger, payments. */
@Component({
  selector: 'ohm-credits-tabs',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatTabsModule, RouterLink, RouterLinkActive],
  template: `
    <nav mat-tab-nav-bar [tabPanel]="panel" aria-label="Credit pages">
      @for (tab of tabs; track tab.path) {
        <a mat-tab-link [routerLink]="tab.path" routerLinkActive #rla="routerLinkActive" [routerLinkActiveOptions]="{ exact: true }" [active]="rla.isActive">{{ tab.label }}</a>
      }
    </nav>
    <mat-tab-nav-panel #panel><ng-content /></mat-tab-nav-panel>
  `,
  styles: `nav { margin-bottom: 24px; }`,
})
export class CreditsTabs {
  protected readonly tabs = [
    { label: 'Balance and packs', path: '/credits' },
    { label: 'Ledger', path: '/credits/ledger' },
    { label: 'Payments', path: '/credits/payments' },
  ];
}
