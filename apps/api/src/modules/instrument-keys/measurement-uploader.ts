import type { NextFunction, Request, Response } from 'express';
import { isInstrumentKey } from '@ohmprint/contracts';
import { labIdOf } from '../../core/tenancy';
import { dataSource } from '../../db/data-source';
import { requireRole } from '../auth/require-auth';
import type { Uploader } from '../measurements/upload-measurements';
import { authenticateInstrumentKey } from './instrument-key-service';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Locals {
      uploader: Uploader;
      uploaderLabId: string;
    }
  }
}

const analystOnly = requireRole('analyst');

/**
 * Sign-in for the measurement upload route, the one route an instrument key opens: a bearer
 * token starting `ohmbench-` (or, for keys issued earlier, `ohm_live_`) is a bench computer's key; anything else must be a signed-in analyst.
 */
export async function requireMeasurementUploader(req: Request, res: Response, next: NextFunction): Promise<void> {
  const token = req.headers.authorization?.match(/^Bearer\s+(\S+)$/i)?.[1];
  if (token && isInstrumentKey(token)) {
    const key = await authenticateInstrumentKey(dataSource.manager, token);
    res.locals.uploader = { kind: 'instrument-key', keyId: key.keyId };
    res.locals.uploaderLabId = key.labId;
    return next();
  }
  await analystOnly(req, res, () => undefined);
  res.locals.uploader = { kind: 'user', userId: res.locals.auth.userId };
  res.locals.uploaderLabId = labIdOf(res.locals.auth);
  next();
}
