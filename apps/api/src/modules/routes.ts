import { Router } from 'express';
import { authRouter } from './auth/router';
import { clientOrganisationsRouter } from './client-organisations/router';
import { clientTeamRouter } from './client-team/router';
import { healthRouter } from './health/router';
import { invitationsRouter } from './invitations/router';
import { meRouter } from './me/router';
import { operatorLabsRouter } from './operator-labs/router';
import { staffRouter } from './staff/router';
import { labReportsRouter } from './reports/lab-reports.router';
import { clientReportsRouter } from './reports/client-reports.router';
import { signingCredentialRouter } from './reports/signing/signing-credential.router';
import { verificationRouter } from './verification/verification.router';
import { samplesRouter } from './samples/router';
import { intakeRouter } from './intake/router';
import { custodyRouter } from './custody/router';
import { measurementsRouter } from './measurements/router';
import { instrumentKeysRouter } from './instrument-keys/router';
import { librariesRouter } from './libraries/router';
import { analysesRouter } from './analyses/router';
import { reviewsRouter } from './reviews/router';
import { clientOrdersRouter } from './orders/router';

/** Every feature's router, one line each. Paths are under /api. */
export function apiRoutes(): Router {
  const api = Router();
  api.use('/health', healthRouter());
  api.use('/auth', authRouter());
  api.use('/invitations', invitationsRouter());
  api.use('/me', meRouter());
  api.use('/lab/staff', staffRouter());
  api.use('/lab/client-organisations', clientOrganisationsRouter());
  api.use('/operator/labs', operatorLabsRouter());
  api.use('/client/team', clientTeamRouter());
  api.use('/lab/reports', labReportsRouter());
  api.use('/lab/signing-credential', signingCredentialRouter());
  api.use('/client/reports', clientReportsRouter());
  api.use('/public/verify', verificationRouter());
  api.use('/lab', samplesRouter());
  api.use('/lab', intakeRouter());
  api.use('/lab', custodyRouter());
  api.use('/lab', measurementsRouter());
  api.use('/lab', instrumentKeysRouter());
  api.use('/lab', librariesRouter());
  api.use('/lab', analysesRouter());
  api.use('/lab', reviewsRouter());
  api.use('/client', clientOrdersRouter());
  return api;
}
