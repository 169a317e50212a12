import type { Options } from 'express-rate-limit';
import { dataSource } from '../db/data-source';
import { useTestApp } from '../testing';
import { PostgresRateStore } from './postgres-rate-store';

useTestApp();

const storeWithWindow = (prefix: string, windowMs: number): PostgresRateStore => {
  const store = new PostgresRateStore(dataSource, prefix);
  store.init({ windowMs } as Options);
  return store;
};

describe('rate-limit counts in PostgreSQL', () => {
  it('counts hits per key within a window and tells when it resets', async () => {
    const store = storeWithWindow('t1:', 60_000);
    const before = Date.now();
    expect((await store.increment('a')).totalHits).toBe(1);
    const second = await store.increment('a');
    expect(second.totalHits).toBe(2);
    expect(second.resetTime!.getTime()).toBeGreaterThan(before + 55_000);
    expect((await store.increment('b')).totalHits).toBe(1);
    expect(await store.get('a')).toEqual({ totalHits: 2, resetTime: second.resetTime });
  });

  it('adds up concurrent hits exactly', async () => {
    const store = storeWithWindow('t2:', 60_000);
    await Promise.all(Array.from({ length: 25 }, () => store.increment('busy')));
    expect((await store.get('busy'))?.totalHits).toBe(25);
  });

  it('starts again at one hit once the window has run out', async () => {
    const store = storeWithWindow('t3:', 300);
    await store.increment('a');
    await store.increment('a');
    await new Promise((r) => setTimeout(r, 400));
    expect(await store.get('a')).toBeUndefined();
    expect((await store.increment('a')).totalHits).toBe(1);
  });

  it('takes back a hit (a successful sign-in) and forgets a key on reset', async () => {
    const store = storeWithWindow('t4:', 60_000);
    await store.increment('a');
    await store.increment('a');
    await store.decrement('a');
    expect((await store.get('a'))?.totalHits).toBe(1);
    await store.resetKey('a');
    expect(await store.get('a')).toBeUndefined();
  });

  it('keeps limiters apart by prefix', async () => {
    const signIn = storeWithWindow('t5-sign-in:', 60_000);
    const verify = storeWithWindow('t5-verify:', 60_000);
    await signIn.increment('same-address');
    expect(await verify.get('same-address')).toBeUndefined();
  });
});
