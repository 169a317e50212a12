import { z } from 'zod';
import { UserRefSchema } from './refs';

/** Keys look like `ohmbench-` + 40 base-32 characters; only a SHA-256 hash is stored. */
export const INSTRUMENT_KEY_PREFIX = 'ohmbench-';
/** The prefix of keys issued before `ohmbench-`: they keep working until revoked. */
export const EARLIER_INSTRUMENT_KEY_PREFIX = 'ohm_live_';

/** Whether a bearer token is an instrument key (of either shape) rather than a sign-in token. */
export const isInstrumentKey = (token: string): boolean =>
  token.startsWith(INSTRUMENT_KEY_PREFIX) || token.startsWith(EARLIER_INSTRUMENT_KEY_PREFIX);

export const CreateInstrumentKeySchema = z.object({ name: z.string().trim().min(1).max(100) });
export type CreateInstrumentKey = z.infer<typeof CreateInstrumentKeySchema>;

export const InstrumentKeySchema = z.object({
  id: z.uuid(),
  name: z.string(),
  /** First characters of the key, enough to recognise it in a bench computer's settings. */
  prefix: z.string(),
  createdBy: UserRefSchema,
  createdAt: z.iso.datetime({ offset: true }),
  lastUsedAt: z.iso.datetime({ offset: true }).nullable(),
  revokedAt: z.iso.datetime({ offset: true }).nullable(),
});
export type InstrumentKey = z.infer<typeof InstrumentKeySchema>;

/** Answer to issuing a key: the only time the full key is shown. */
export const IssuedInstrumentKeySchema = z.object({ key: InstrumentKeySchema, secret: z.string() });
export type IssuedInstrumentKey = z.infer<typeof IssuedInstrumentKeySchema>;
