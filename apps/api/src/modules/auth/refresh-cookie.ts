import type { CookieOptions, Request, Response } from 'express';
import { config } from '../../config';

export const REFRESH_COOKIE = 'ohmprint_refresh';

function cookieOptions(): CookieOptions {
  return { httpOnly: true, sameSite: 'strict', secure: config.auth.cookieSecure, path: '/api/auth' };
}

export function setRefreshCookie(res: Response, token: string): void {
  res.cookie(REFRESH_COOKIE, token, { ...cookieOptions(), maxAge: config.auth.refreshTtlDays * 86400_000 });
}

export function clearRefreshCookie(res: Response): void {
  res.clearCookie(REFRESH_COOKIE, cookieOptions());
}

export function refreshCookieOf(req: Request): string | undefined {
  const value = (req.cookies as Record<string, unknown> | undefined)?.[REFRESH_COOKIE];
  return typeof value === 'string' && value.length > 0 ? value : undefined;
}
