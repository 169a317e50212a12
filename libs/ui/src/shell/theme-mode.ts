import { DOCUMENT, Injectable, inject, signal } from '@angular/core';

export type SchemeChoice = 'system' | 'light' | 'dark';
const STORAGE_KEY = 'ohm.colour-scheme';

/** Light, dark or follow the system; remembered on this device only. */
@Injectable({ providedIn: 'root' })
export class ThemeMode {
  private readonly document = inject(DOCUMENT);
  readonly choice = signal<SchemeChoice>(readChoice());

  apply(): void {
    const root = this.document.documentElement;
    root.classList.toggle('ohm-scheme-light', this.choice() === 'light');
    root.classList.toggle('ohm-scheme-dark', this.choice() === 'dark');
  }

  choose(choice: SchemeChoice): void {
    this.choice.set(choice);
    try {
      localStorage.setItem(STORAGE_KEY, choice);
    } catch {
      // Private browsing may refuse storage; the choice still holds for this visit.
    }
    this.apply();
  }
}

function readChoice(): SchemeChoice {
  try {
    const stored = localStorage.getItem(STORAGE_KEY);
    return stored === 'light' || stored === 'dark' ? stored : 'system';
  } catch {
    return 'system';
  }
}
