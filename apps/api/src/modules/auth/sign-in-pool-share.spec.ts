import request from 'supertest';
import { config } from '../../config';
import { dataSource } from '../../db/data-source';
import { useTestApp } from '../../testing';

/**
 * Issue 10, availability during a sign-in flood: the sign-in limits are counted in PostgreSQL, and
 * a flood of sign-ins must not take every pooled connection from signed-in people's requests. At
 * most half the pool counts sign-in limits at any moment, however many sign-ins arrive at once.
 */
jest.setTimeout(120_000);

const t = useTestApp();

describe('a sign-in flood and the database pool', () => {
  it('counts sign-in limits on at most half the pool’s connections at once, and still answers every attempt', async () => {
    const poolSize = (dataSource.options as { poolSize?: number }).poolSize ?? config.database.poolSize;
    const original = dataSource.query.bind(dataSource);
    let inFlight = 0;
    let peak = 0;
    const spy = jest.spyOn(dataSource, 'query').mockImplementation(async (sql: string, parameters?: unknown[] | object) => {
      const counting = /rate_limit_window/.test(sql);
      if (counting) peak = Math.max(peak, ++inFlight);
      try {
        return await original(sql, parameters);
      } finally {
        if (counting) inFlight--;
      }
    });
    try {
      const attempts = await Promise.all(
        Array.from({ length: 3 * poolSize }, (_, i) => request(t.app).post('/api/auth/sign-in').send({ email: `nobody-${i}@flood.test`, password: 'guess-guess-guess' })),
      );
      expect(attempts.every((r) => r.status === 401 || r.status === 429)).toBe(true);
      expect(peak).toBeGreaterThan(0);
      expect(peak).toBeLessThanOrEqual(Math.max(1, Math.floor(poolSize / 2)));
    } finally {
      spy.mockRestore();
    }
  });
});
