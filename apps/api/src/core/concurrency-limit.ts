import type { NextFunction, Request, Response } from 'express';
import { ApiError } from './api-error';

/**
 * At most `max` requests through this point at once in this process; the next one is refused
 * at once (429 naming the limit, with Retry-After) before its body is read, so a burst of large
 * anonymous uploads cannot hold the process's memory.
 */
export function concurrencyLimit(max: number, what: string) {
  let inFlight = 0;
  const limiter = (req: Request, res: Response, next: NextFunction): void => {
    if (inFlight >= max) {
      // The unread body is left for the connection to drop.
      res.setHeader('Connection', 'close');
      next(new ApiError(429, 'Too many at once', `At most ${max} ${what} are handled at the same time; try again in a few seconds.`, { type: 'too-many-concurrent', headers: { 'Retry-After': '2' } }));
      return;
    }
    inFlight += 1;
    let released = false;
    const release = (): void => {
      if (released) return;
      released = true;
      inFlight -= 1;
    };
    res.once('finish', release);
    res.once('close', release);
    next();
  };
  return Object.assign(limiter, { inFlight: () => inFlight });
}

/**
 * Like `concurrencyLimit`, counted per key (e.g. per lab): at most `max` requests of one key in
 * flight in this process; the next of that key is refused at once (429, Retry-After) before its
 * body is read, while other keys go on.
 */
export function keyedConcurrencyLimit(max: number, what: string, keyOf: (res: Response) => string) {
  const inFlight = new Map<string, number>();
  const limiter = (_req: Request, res: Response, next: NextFunction): void => {
    const key = keyOf(res);
    const now = inFlight.get(key) ?? 0;
    if (now >= max) {
      res.setHeader('Connection', 'close');
      next(new ApiError(429, 'Too many at once', `At most ${max} ${what} are handled at the same time; try again in a few seconds.`, { type: 'too-many-concurrent', headers: { 'Retry-After': '2' } }));
      return;
    }
    inFlight.set(key, now + 1);
    let released = false;
    const release = (): void => {
      if (released) return;
      released = true;
      const left = (inFlight.get(key) ?? 1) - 1;
      if (left > 0) inFlight.set(key, left);
      else inFlight.delete(key);
    };
    res.once('finish', release);
    res.once('close', release);
    next();
  };
  return Object.assign(limiter, { inFlight: (key: string) => inFlight.get(key) ?? 0 });
}
