import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { ScreeningCaution, Session } from '@ohmprint/ui';
import { CreditSummary } from '../credits/credit-summary';
import { OpenOrders } from '../orders/open-orders';
import { LatestReports } from '../reports/latest-reports';

@Component({
  selector: 'ohm-client-home',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RouterLink, MatButtonModule, MatIconModule, ScreeningCaution, CreditSummary, OpenOrders, LatestReports],
  templateUrl: './client-home.html',
  styleUrl: './client-home.scss',
})
export class ClientHome {
  private readonly session = inject(Session);
  protected readonly user = this.session.user;
  protected readonly isAdmin = computed(() => this.session.hasAnyRole(['client-admin']));
  protected readonly steps = [
    { icon: 'inventory_2', title: 'Build your reference library', text: 'Register each product and send the lab a few authentic lots. The lab measures them and publishes a library once it holds enough lots.' },
    { icon: 'shopping_cart', title: 'Order a check', text: 'When a suspect bottle or pack turns up, order a check against the product\'s library and pay with test credits. Print the sample labels and custody form.' },
    { icon: 'verified', title: 'Receive a signed report', text: 'The lab measures the sample, a second person reviews the result, and you get a signed PDF that anyone can verify online.' },
  ];
}
