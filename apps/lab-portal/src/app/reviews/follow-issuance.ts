import type { ApprovalResult } from '@ohmprint/contracts';
import { defer, repeat, takeWhile, timer, type Observable } from 'rxjs';

/**
 * How long to wait before asking again, by how many times it has been asked. A report is usually
 * issued a fraction of a second after the approval, so the first two seconds ask four times a
 * second; then once a second for a minute, and every five seconds after that (a queue behind
 * other reports, or a worker being restarted).
 */
export function issuancePollDelayMs(asked: number): number {
  if (asked <= 8) return 250;
  if (asked <= 68) return 1000;
  return 5000;
}

/** Asks at once, then again after `issuancePollDelayMs`, until the report is issued or failed (that answer included). */
export function followIssuance(ask: () => Observable<ApprovalResult>): Observable<ApprovalResult> {
  return defer(ask).pipe(
    repeat({ delay: (asked) => timer(issuancePollDelayMs(asked)) }),
    takeWhile((i) => i.state === 'issuing', true),
  );
}
