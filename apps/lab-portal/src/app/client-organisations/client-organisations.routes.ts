import type { Routes } from '@angular/router';
import { ClientOrganisationsPage } from './client-organisations-page';

export default [{ path: '', title: 'Client organisations · Ohmprint lab', component: ClientOrganisationsPage }] satisfies Routes;
