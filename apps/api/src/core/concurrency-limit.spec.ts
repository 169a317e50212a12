import type { NextFunction, Request, Response } from 'express';
import { EventEmitter } from 'node:events';
import { ApiError } from './api-error';
import { keyedConcurrencyLimit } from './concurrency-limit';

/** A response that can finish later, carrying the lab in res.locals as the uploader check leaves it. */
function response(lab: string): Response & { finish: () => void } {
  const res = Object.assign(new EventEmitter(), { locals: { uploaderLabId: lab }, setHeader: jest.fn() });
  return Object.assign(res, { finish: () => res.emit('finish') }) as unknown as Response & { finish: () => void };
}

describe('a per-lab concurrency limit', () => {
  it('lets two of one lab through, refuses the third at once with 429 and Retry-After, and leaves other labs alone', () => {
    const limit = keyedConcurrencyLimit(2, 'measurement uploads of one lab', (res) => String(res.locals.uploaderLabId));
    const outcomes: unknown[] = [];
    const next: NextFunction = (err?: unknown) => outcomes.push(err ?? 'through');
    const [a, b, c, other] = [response('lab-a'), response('lab-a'), response('lab-a'), response('lab-b')];
    for (const res of [a, b, c, other]) limit({} as Request, res, next);
    expect(outcomes.slice(0, 2)).toEqual(['through', 'through']);
    expect(outcomes[2]).toBeInstanceOf(ApiError);
    expect(outcomes[2]).toMatchObject({ status: 429, headers: { 'Retry-After': '2' } });
    expect((outcomes[2] as ApiError).detail).toMatch(/At most 2 measurement uploads of one lab/);
    expect(outcomes[3]).toBe('through');
    // One finishes: the lab has room again; a closed connection after finishing is not counted twice.
    a.finish();
    a.emit('close');
    expect(limit.inFlight('lab-a')).toBe(1);
    limit({} as Request, response('lab-a'), next);
    expect(outcomes[4]).toBe('through');
  });
});
