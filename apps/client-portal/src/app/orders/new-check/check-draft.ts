import { Injectable } from '@angular/core';

/** One sample as typed in the stepper (photos are not kept: a File cannot be stored). */
export interface DraftSample {
  obtainedWhere: string;
  obtainedOn: string;
  labelText: string;
  lotClaimed: string;
  container: string;
  notes: string;
}

export interface CheckDraft {
  productId: string;
  samples: DraftSample[];
}

const KEY = 'ohmprint.check-draft';

/**
 * Keeps what the client typed into a new check in sessionStorage, so leaving to buy credits (or a
 * reload) loses nothing; cleared once the order is placed. Per tab, gone when the tab closes.
 */
@Injectable({ providedIn: 'root' })
export class CheckDraftStore {
  load(): CheckDraft | null {
    try {
      const raw = sessionStorage.getItem(KEY);
      if (!raw) return null;
      const draft = JSON.parse(raw) as CheckDraft;
      return typeof draft.productId === 'string' && Array.isArray(draft.samples) ? draft : null;
    } catch {
      return null;
    }
  }

  save(draft: CheckDraft): void {
    try {
      sessionStorage.setItem(KEY, JSON.stringify(draft));
    } catch {
      // Storage full or disabled: the form still works, it just won't survive leaving the page.
    }
  }

  clear(): void {
    sessionStorage.removeItem(KEY);
  }
}
