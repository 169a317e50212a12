import type { Routes } from '@angular/router';
import { LabProfilePage } from './lab-profile-page';
import { SigningCertificatePage } from './signing-certificate-page';

export default [
  { path: '', pathMatch: 'full', redirectTo: 'profile' },
  { path: 'profile', title: 'Lab profile · Ohmprint lab', component: LabProfilePage },
  { path: 'signing-certificate', title: 'Signing certificate · Ohmprint lab', component: SigningCertificatePage },
] satisfies Routes;
