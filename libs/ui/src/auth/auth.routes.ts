import type { Routes } from '@angular/router';
import { AcceptInvitationPage } from './accept-invitation-page';
import { ForgotPasswordPage } from './forgot-password-page';
import { signedOutGuard } from './guards';
import { ResetPasswordPage } from './reset-password-page';
import { SignInPage } from './sign-in-page';

/** The signed-out screens, the same in both portals (links in e-mails point at these paths). */
export const authRoutes: Routes = [
  { path: 'sign-in', title: 'Sign in · Ohmprint', component: SignInPage, canActivate: [signedOutGuard] },
  { path: 'forgot-password', title: 'Reset password · Ohmprint', component: ForgotPasswordPage },
  { path: 'reset-password', title: 'Choose a new password · Ohmprint', component: ResetPasswordPage },
  { path: 'accept-invitation', title: 'Join · Ohmprint', component: AcceptInvitationPage },
];
