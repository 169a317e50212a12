import { ApiError } from '../../core/api-error';
import type { Account } from './load-auth-context';

/** Deactivated people and suspended labs are refused with a message that says why. */
export function assertAccountMaySignIn(account: Account): void {
  if (account.status !== 'active') {
    throw ApiError.forbidden('This account has been deactivated. Ask an administrator of your organisation to restore it.');
  }
  if (account.labStatus === 'suspended') {
    throw new ApiError(403, 'Lab suspended', `${account.labName} is suspended on Ohmprint, so its accounts cannot sign in. Contact the platform operator.`, {
      type: 'lab-suspended',
    });
  }
}
