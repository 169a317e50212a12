export type { AuthContext } from './auth-context';
export { requireAuth, requireRole } from './require-auth';
export { hashPassword, verifyPassword } from './passwords';
export { revokeAllSessionsOf } from './refresh-sessions';
