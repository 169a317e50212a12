import jwt from 'jsonwebtoken';
import { config } from '../../config';
import { ApiError } from '../../core/api-error';

const ISSUER = 'ohmprint';
const AUDIENCE = 'ohmprint-api';

/** A short-lived HS256 token naming only the user; roles are read from the database per request. */
export function signAccessToken(userId: string): string {
  return jwt.sign({}, config.auth.accessSecret, {
    algorithm: 'HS256',
    subject: userId,
    issuer: ISSUER,
    audience: AUDIENCE,
    expiresIn: config.auth.accessTtlSeconds,
  });
}

/** Only HS256 is accepted: `alg: none` and every other algorithm are refused before any claim is read. */
export function verifyAccessToken(token: string): string {
  try {
    const payload = jwt.verify(token, config.auth.accessSecret, { algorithms: ['HS256'], issuer: ISSUER, audience: AUDIENCE });
    if (typeof payload === 'string' || !payload.sub) throw new Error('no subject');
    return payload.sub;
  } catch (err) {
    if (err instanceof jwt.TokenExpiredError) {
      throw ApiError.unauthorized('The access token has expired; refresh it (POST /api/auth/refresh) or sign in again.');
    }
    throw ApiError.unauthorized('The access token is not valid (bad signature, algorithm or claims); sign in again.');
  }
}
