import { z } from 'zod';

export const EmailSchema = z.string().trim().max(254, 'must be at most 254 characters (the longest address mail servers accept)').toLowerCase().pipe(z.email({ message: 'must be an e-mail address' })).meta({ example: 'analyst@calder.test' });
export const DisplayNameSchema = z.string().trim().min(1, 'must not be empty').max(120);
/** Passwords: long enough to resist guessing; bcrypt reads only the first 72 bytes. */
export const PasswordSchema = z.string().min(10, 'must be at least 10 characters').max(72, 'must be at most 72 characters');
export const IdParamsSchema = z.object({ id: z.uuid({ message: 'must be a UUID' }) });
export const TokenSchema = z.string().min(20, 'is not a valid token').max(200);
