import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatTabsModule } from '@angular/material/tabs';
import { RouterLink, RouterLinkActive } from '@angular/router';

@Component({
  selector: 'ohm-billing-tabs',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatTabsModule, RouterLink, RouterLinkActive],
  template: `
    <nav mat-tab-nav-bar [tabPanel]="panel" aria-label="Billing pages">
      @for (tab of tabs; track tab.path) {
        <a mat-tab-link [routerLink]="tab.path" routerLinkActive #rla="routerLinkActive" [routerLinkActiveOptions]="{ exact: true }" [active]="rla.isActive">{{ tab.label }}</a>
      }
    </nav>
    <mat-tab-nav-panel #panel><ng-content /></mat-tab-nav-panel>
  `,
  styles: `nav { margin-bottom: 16px; }`,
})
export class BillingTabs {
  protected readonly tabs = [
    { label: 'Prices & packs', path: '/billing' },
    { label: 'Payments', path: '/billing/payments' },
    { label: 'Adjustments', path: '/billing/adjustments' },
  ];
}
