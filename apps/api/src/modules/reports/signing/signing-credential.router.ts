import { Router } from 'express';
import { SigningCredentialStateSchema, UploadSigningCredentialFieldsSchema, type SigningCredentialState } from '@ohmprint/contracts';
import { labIdOf, validate } from '../../../core';
import { dataSource } from '../../../db/data-source';
import { registerRoute } from '../../../openapi/registry';
import { requireRole } from '../../auth/require-auth';
import { singleFileUpload } from '../single-file-upload';
import { currentCredential, describeCredential, openUploadedCredential, uploadCredential } from './signing-credentials';

const tag = 'Reports';

/** The lab admin's view of the report-signing credential: its public facts, and replacing it. */
export function signingCredentialRouter(): Router {
  const router = Router();

  registerRoute({ method: 'get', path: '/lab/signing-credential', tag, summary: "The certificate reports are signed with (subject, issuer, fingerprint, validity; never the key)", roles: ['lab-admin'], response: SigningCredentialStateSchema });
  router.get('/', requireRole('lab-admin'), async (_req, res) => {
    const credential = await currentCredential(dataSource.manager, labIdOf(res.locals.auth));
    const body: SigningCredentialState = { credential: credential ? describeCredential(credential) : null };
    res.json(body);
  });

  registerRoute({ method: 'post', path: '/lab/signing-credential', tag, summary: 'Upload a PKCS#12 file (field "file", ≤ 1 MB) and its passphrase; replaces the current credential', roles: ['lab-admin'], body: UploadSigningCredentialFieldsSchema, requestMediaType: 'multipart/form-data', response: SigningCredentialStateSchema, status: 201 });
  router.post('/', requireRole('lab-admin'), singleFileUpload('file', 1024 * 1024, 'PKCS#12 file'), validate({ body: UploadSigningCredentialFieldsSchema }), async (req, res) => {
    const auth = res.locals.auth;
    const { passphrase } = res.locals.body as { passphrase: string };
    const p12 = req.file!.buffer;
    // Keys derived in the worker pool first; only then the short transaction that stores the credential.
    const details = await openUploadedCredential(p12, passphrase);
    const stored = await dataSource.transaction((manager) => uploadCredential(manager, { labId: labIdOf(auth), actorUserId: auth.userId, p12, passphrase, details }));
    res.status(201).json({ credential: describeCredential(stored) } satisfies SigningCredentialState);
  });

  return router;
}
