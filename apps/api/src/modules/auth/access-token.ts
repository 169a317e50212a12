import { createSecretKey, type KeyObject } from 'node:crypto';
import jwt from 'jsonwebtoken';
import { config } from '../../config';
import { ApiError } from '../../core/api-error';

const ISSUER = 'ohmprint';
const AUDIENCE = 'ohmprint-api';

/** What an access token stands for besides its user. */
export interface AccessTokenSession {
  /** The sign-in (refresh-token family) it belongs to: revoking the family ends the token at once. */
  familyId?: string;
  /** The user's token version when issued: a password change or reset moves it on. */
  tokenVersion?: number;
}

export interface VerifiedAccessToken {
  userId: string;
  familyId: string | null;
  tokenVersion: number;
}

let key: { secret: string; object: KeyObject } | undefined;

/**
 * The signing secret as a key object, made once. Given the secret as a string, jsonwebtoken first
 * tries to read it as a PEM public key and only after that failure makes a secret key: about a
 * millisecond of CPU on every authenticated request, the largest share of a small request's cost.
 */
function accessKey(): KeyObject {
  if (key?.secret !== config.auth.accessSecret) key = { secret: config.auth.accessSecret, object: createSecretKey(Buffer.from(config.auth.accessSecret)) };
  return key.object;
}

/**
 * A short-lived HS256 token naming the user, their sign-in and their token version; roles are read
 * from the database per request, and so is whether the sign-in or the version still holds.
 */
export function signAccessToken(userId: string, session: AccessTokenSession = {}): string {
  const claims: Record<string, unknown> = { tv: session.tokenVersion ?? 0 };
  if (session.familyId) claims.sid = session.familyId;
  return jwt.sign(claims, accessKey(), {
    algorithm: 'HS256',
    subject: userId,
    issuer: ISSUER,
    audience: AUDIENCE,
    expiresIn: config.auth.accessTtlSeconds,
  });
}

/** Only HS256 is accepted: `alg: none` and every other algorithm are refused before any claim is read. */
export function verifyAccessToken(token: string): VerifiedAccessToken {
  try {
    const payload = jwt.verify(token, accessKey(), { algorithms: ['HS256'], issuer: ISSUER, audience: AUDIENCE });
    if (typeof payload === 'string' || !payload.sub) throw new Error('no subject');
    const sid = typeof payload.sid === 'string' && /^[0-9a-f-]{36}$/i.test(payload.sid) ? payload.sid : null;
    return { userId: payload.sub, familyId: sid, tokenVersion: typeof payload.tv === 'number' ? payload.tv : 0 };
  } catch (err) {
    if (err instanceof jwt.TokenExpiredError) {
      throw ApiError.unauthorized('The access token has expired; refresh it (POST /api/auth/refresh) or sign in again.');
    }
    throw ApiError.unauthorized('The access token is not valid (bad signature, algorithm or claims); sign in again.');
  }
}
