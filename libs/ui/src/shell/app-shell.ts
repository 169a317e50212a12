import { BreakpointObserver } from '@angular/cdk/layout';
import { NgComponentOutlet } from '@angular/common';
import { ChangeDetectionStrategy, Component, ElementRef, computed, inject, viewChild } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatListModule } from '@angular/material/list';
import { MatMenuModule } from '@angular/material/menu';
import { MatSidenav, MatSidenavModule } from '@angular/material/sidenav';
import { MatToolbarModule } from '@angular/material/toolbar';
import { RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { map } from 'rxjs';
import { Session } from '../auth/session';
import { PORTAL } from '../portal/portal-config';
import { NAV_ITEMS, visibleNavItems } from './nav-item';
import { ThemeMode, type SchemeChoice } from './theme-mode';
import { TOOLBAR_ITEMS } from './toolbar-items';

/** Below this width the side navigation becomes an overlay opened from the toolbar. */
const COMPACT_LAYOUT = '(max-width: 839.98px)';

@Component({
  selector: 'ohm-app-shell',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    MatToolbarModule,
    MatSidenavModule,
    MatListModule,
    MatIconModule,
    MatButtonModule,
    MatMenuModule,
    RouterOutlet,
    RouterLink,
    RouterLinkActive,
    NgComponentOutlet,
  ],
  templateUrl: './app-shell.html',
  styleUrl: './app-shell.scss',
})
export class AppShell {
  private readonly session = inject(Session);
  private readonly themeMode = inject(ThemeMode);
  private readonly drawer = viewChild.required<MatSidenav>('drawer');
  private readonly main = viewChild.required<ElementRef<HTMLElement>>('main');
  private readonly navItems = inject(NAV_ITEMS);

  protected readonly portal = inject(PORTAL);
  protected readonly toolbarItems = inject(TOOLBAR_ITEMS);
  protected readonly user = this.session.user;
  protected readonly organisation = this.session.organisationName;
  protected readonly nav = computed(() => visibleNavItems(this.navItems, this.session.roles()));
  protected readonly compact = toSignal(
    inject(BreakpointObserver)
      .observe(COMPACT_LAYOUT)
      .pipe(map((state) => state.matches)),
    { initialValue: false },
  );
  protected readonly scheme = this.themeMode.choice;
  protected readonly schemes: { value: SchemeChoice; label: string; icon: string }[] = [
    { value: 'system', label: 'Match my device', icon: 'contrast' },
    { value: 'light', label: 'Light', icon: 'light_mode' },
    { value: 'dark', label: 'Dark', icon: 'dark_mode' },
  ];
  protected chooseScheme(choice: SchemeChoice): void {
    this.themeMode.choose(choice);
  }

  protected closeNavOnCompact(): void {
    if (this.compact()) void this.drawer().close();
  }

  protected skipToMain(): void {
    this.main().nativeElement.focus();
  }

  protected signOut(): void {
    this.session.signOut().subscribe();
  }
}
