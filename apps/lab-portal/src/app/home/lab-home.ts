import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { EmptyState, NAV_ITEMS, Session, roleList, visibleNavItems } from '@ohmprint/ui';
import { WorkQueue } from '../queue/work-queue';

@Component({
  selector: 'ohm-lab-home',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RouterLink, MatCardModule, MatButtonModule, MatIconModule, EmptyState, WorkQueue],
  templateUrl: './lab-home.html',
  styleUrl: './lab-home.scss',
})
export class LabHome {
  private readonly session = inject(Session);
  private readonly navItems = inject(NAV_ITEMS);
  protected readonly user = this.session.user;
  protected readonly roles = computed(() => roleList(this.session.roles()));
  protected readonly isOperator = computed(() => this.session.hasAnyRole(['platform-operator']));
  protected readonly shortcuts = computed(() => visibleNavItems(this.navItems, this.session.roles()).filter((item) => item.path !== '/'));
}
