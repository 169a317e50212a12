import { HttpContext, HttpContextToken } from '@angular/common/http';

/** The caller shows this request's errors itself (inline), so no snack bar. */
export const QUIET = new HttpContextToken<boolean>(() => false);
/** Auth endpoints: never attach a token and never try to refresh on 401. */
export const NO_AUTH = new HttpContextToken<boolean>(() => false);

export function quietRequest(context = new HttpContext()): HttpContext {
  return context.set(QUIET, true);
}

export function authEndpoint(context = new HttpContext()): HttpContext {
  return context.set(NO_AUTH, true).set(QUIET, true);
}
