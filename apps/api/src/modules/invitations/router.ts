import { Router } from 'express';
import {
  AcceptInvitationRequestSchema,
  InvitationPreviewSchema,
  InvitationTokenRequestSchema,
  SessionResponseSchema,
  type AcceptInvitationRequest,
  type InvitationTokenRequest,
} from '@ohmprint/contracts';
import { validate } from '../../core/validate';
import { registerRoute } from '../../openapi/registry';
import { acceptInvitation, previewInvitation } from './accept-invitation';

const tag = 'Invitations';

/** Public: the invitee has no account yet; the token from the e-mail is the credential. */
export function invitationsRouter(): Router {
  const router = Router();

  registerRoute({ method: 'post', path: '/invitations/preview', tag, summary: 'Show who invited whom, before accepting', roles: [], body: InvitationTokenRequestSchema, response: InvitationPreviewSchema });
  router.post('/preview', validate({ body: InvitationTokenRequestSchema }), async (_req, res) => {
    res.json(await previewInvitation((res.locals.body as InvitationTokenRequest).token));
  });

  registerRoute({ method: 'post', path: '/invitations/accept', tag, summary: 'Accept an invitation: set display name and password, get signed in', roles: [], body: AcceptInvitationRequestSchema, response: SessionResponseSchema, status: 201 });
  router.post('/accept', validate({ body: AcceptInvitationRequestSchema }), async (req, res) => {
    res.status(201).json(await acceptInvitation(req, res, res.locals.body as AcceptInvitationRequest));
  });

  return router;
}
