import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { PORTAL } from '../portal/portal-config';

/** The centred card every signed-out screen sits in. */
@Component({
  selector: 'ohm-auth-frame',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `
    <main class="frame" id="main">
      <section class="card" [attr.aria-labelledby]="'ohm-auth-heading'">
        <div class="brand">
          <mat-icon class="mark" aria-hidden="true">graphic_eq</mat-icon>
          <span class="name">Ohmprint</span>
          <span class="portal">{{ portal.title }}</span>
        </div>
        <h1 id="ohm-auth-heading">{{ heading() }}</h1>
        @if (lead(); as text) {
          <p class="lead">{{ text }}</p>
        }
        <ng-content />
      </section>
      <p class="other">
        Looking for the {{ portal.otherPortal.title.toLowerCase() }}?
        <a [href]="portal.otherPortal.url">Go to the {{ portal.otherPortal.title.toLowerCase() }}</a>
      </p>
    </main>
  `,
  styles: `
    .frame {
      min-height: 100%;
      box-sizing: border-box;
      display: flex;
      flex-direction: column;
      align-items: center;
      justify-content: center;
      padding: 24px 16px;
      background: var(--mat-sys-surface-container);
    }
    .card {
      box-sizing: border-box;
      width: min(440px, 100%);
      padding: 32px;
      border-radius: var(--mat-sys-corner-large);
      background: var(--mat-sys-surface-container-lowest);
      border: 1px solid var(--mat-sys-outline-variant);
      box-shadow: var(--mat-sys-level1);
    }
    .brand {
      display: flex;
      align-items: center;
      gap: 8px;
      margin-bottom: 16px;
    }
    .mark {
      color: var(--mat-sys-primary);
    }
    .name {
      font: var(--mat-sys-title-large);
    }
    .portal {
      font: var(--mat-sys-label-medium);
      padding: 2px 8px;
      border-radius: var(--mat-sys-corner-full);
      background: var(--mat-sys-secondary-container);
      color: var(--mat-sys-on-secondary-container);
    }
    h1 {
      font: var(--mat-sys-headline-small);
      margin: 0 0 8px;
    }
    .lead {
      margin: 0 0 20px;
      color: var(--mat-sys-on-surface-variant);
    }
    .other {
      margin-top: 16px;
      color: var(--mat-sys-on-surface-variant);
      text-align: center;
    }
    @media (max-width: 480px) {
      .card {
        padding: 24px 16px;
      }
    }
  `,
})
export class AuthFrame {
  protected readonly portal = inject(PORTAL);
  readonly heading = input.required<string>();
  readonly lead = input<string>();
}
