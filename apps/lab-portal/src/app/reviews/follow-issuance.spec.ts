import type { ApprovalResult } from '@ohmprint/contracts';
import { of } from 'rxjs';
import { TestScheduler } from 'rxjs/testing';
import { followIssuance } from './follow-issuance';

const answer = (state: ApprovalResult['state']): ApprovalResult => ({
  analysisId: 'a1',
  state,
  report: state === 'issued' ? { id: 'r1', number: 'CAL-2026-000042' } : null,
  detail: state === 'failed' ? 'Issuing the report failed after several attempts.' : null,
});

function scheduler(): TestScheduler {
  return new TestScheduler((actual, expected) => expect(actual).toEqual(expected));
}

describe('followIssuance', () => {
  it('shows a report issued 0.3 s after the approval half a second after it, and then stops asking', () => {
    scheduler().run(({ expectObservable }) => {
      let asked = 0;
      const ask = () => of(answer(++asked < 3 ? 'issuing' : 'issued'));
      expectObservable(followIssuance(ask)).toBe('a 249ms b 249ms (c|)', { a: answer('issuing'), b: answer('issuing'), c: answer('issued') });
    });
  });

  it('asks four times a second for two seconds, then each second for a minute, then every five seconds', () => {
    const s = scheduler();
    s.run(({ expectObservable }) => {
      const times: number[] = [];
      const ask = () => {
        times.push(s.now());
        return of(answer('issuing'));
      };
      expectObservable(followIssuance(ask), '^ 90s !');
      s.flush();
      const gaps = times.slice(1).map((t, i) => t - times[i]);
      expect(gaps.slice(0, 8)).toEqual(Array(8).fill(250));
      expect(gaps.slice(8, 68)).toEqual(Array(60).fill(1000));
      expect(gaps.slice(68).every((g) => g === 5000)).toBe(true);
      expect(gaps.length).toBeGreaterThan(68);
    });
  });

  it('stops at a failed issuance, showing it', () => {
    scheduler().run(({ expectObservable }) => {
      let asked = 0;
      const ask = () => of(answer(++asked < 2 ? 'issuing' : 'failed'));
      expectObservable(followIssuance(ask)).toBe('a 249ms (b|)', { a: answer('issuing'), b: answer('failed') });
    });
  });
});
